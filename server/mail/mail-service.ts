import nodemailer, { type Transport, type Transporter } from 'nodemailer';
import { errorFields, type Logger } from '../logger';
import { renderMail, type MailContent } from './mail-template';
import type { OutboxRepository } from './outbox-repository';

/** Sends a rendered message; the app depends on this, tests may pass their own. */
export interface Mailer {
  /** Renders and sends; rejects when the message could not be handed over. */
  send(to: string, content: MailContent): Promise<void>;
  /** Like `send`, but a failure is logged and answered `false` (for notices that may be lost). */
  trySend(to: string, content: MailContent): Promise<boolean>;
}

/**
 * A nodemailer transport that stores each message in the `outbox` table instead of sending it,
 * for development and tests (the admin's Outbox page shows them).
 */
export function outboxTransport(outbox: OutboxRepository): Transport<{ id: number }> {
  return {
    name: 'tensile-outbox',
    version: '1',
    send(mail, callback) {
      const data = mail.data;
      outbox
        .insert({
          to: addressList(data.to),
          subject: String(data.subject ?? ''),
          text: String(data.text ?? ''),
          html: String(data.html ?? ''),
        })
        .then(
          (id) => callback(null, { id }),
          (error: unknown) => callback(error as Error, { id: 0 }),
        );
    },
  };
}

/** nodemailer through `SMTP_URL` when set, otherwise into the outbox table. */
export class MailService implements Mailer {
  private readonly transporter: Transporter;
  private readonly from: string;

  constructor(
    options: { smtpUrl: string | undefined; publicUrl: string; outbox: OutboxRepository },
    private readonly logger: Logger,
  ) {
    this.transporter = options.smtpUrl
      ? nodemailer.createTransport(options.smtpUrl)
      : nodemailer.createTransport(outboxTransport(options.outbox));
    this.from = `Tensile <no-reply@${new URL(options.publicUrl).hostname}>`;
  }

  async send(to: string, content: MailContent): Promise<void> {
    const message = renderMail(content);
    await this.transporter.sendMail({ from: this.from, to, ...message });
    this.logger.info('Mail sent', { subject: message.subject });
  }

  async trySend(to: string, content: MailContent): Promise<boolean> {
    try {
      await this.send(to, content);
      return true;
    } catch (error) {
      this.logger.error('A mail could not be sent', {
        subject: content.subject,
        ...errorFields(error),
      });
      return false;
    }
  }
}

function addressList(to: unknown): string {
  const list = Array.isArray(to) ? to : [to];
  return list
    .map((entry) =>
      typeof entry === 'object' && entry !== null && 'address' in entry
        ? String((entry as { address: unknown }).address)
        : String(entry),
    )
    .join(', ')
    .toLowerCase();
}
