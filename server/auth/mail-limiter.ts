import type { Response } from 'express';
import { HttpError } from '../http-error';
import { normaliseEmail } from './users-repository';

/** Which e-mails are limited, each counted apart. */
export type LimitedMail = 'password_reset' | 'invitation';

/** This many e-mails per rolling window, per recipient address and per client address. */
export interface MailLimits {
  readonly windowMs: number;
  readonly perRecipient: number;
  readonly perClient: number;
}

/**
 * 3 e-mails to one address and 10 from one client per hour, per kind: common practice for
 * password-reset and invitation forms (enough for a lost or late message, too few to flood an
 * inbox or use the server as a mail cannon).
 */
export const DEFAULT_MAIL_LIMITS: MailLimits = {
  windowMs: 60 * 60_000,
  perRecipient: 3,
  perClient: 10,
};

/** Keys kept before old entries are swept, so a flood of addresses cannot grow memory unbounded. */
const SWEEP_AT = 10_000;

/**
 * Limits the e-mails people can make the server send (password resets, invitation resends). The
 * counts live in this process (a sliding log of send times per key): they guard against floods,
 * not against a restart, and read the app's injectable clock so tests cross the window exactly.
 */
export class MailLimiter {
  private readonly sent = new Map<string, number[]>();

  constructor(
    private readonly now: () => Date = () => new Date(),
    private readonly limits: MailLimits = DEFAULT_MAIL_LIMITS,
  ) {}

  /**
   * Counts one e-mail of `kind` to `recipient` asked from `client`, or throws a 429 (setting
   * Retry-After on `res`) when either count is full. A refused request is not counted.
   */
  take(kind: LimitedMail, recipient: string, client: string, res?: Response): void {
    const at = this.now().getTime();
    if (this.sent.size > SWEEP_AT) this.sweep(at);
    const keys: [string, number][] = [
      [`${kind}|to|${normaliseEmail(recipient)}`, this.limits.perRecipient],
      [`${kind}|from|${client}`, this.limits.perClient],
    ];
    let waitMs = 0;
    for (const [key, limit] of keys) {
      const times = this.recent(key, at);
      if (times.length >= limit) waitMs = Math.max(waitMs, times[0]! + this.limits.windowMs - at);
    }
    if (waitMs > 0) {
      res?.setHeader('Retry-After', String(Math.ceil(waitMs / 1000)));
      throw tooManyMails(kind, waitMs);
    }
    for (const [key] of keys) this.sent.set(key, [...this.recent(key, at), at]);
  }

  private recent(key: string, at: number): number[] {
    return (this.sent.get(key) ?? []).filter((t) => t > at - this.limits.windowMs);
  }

  private sweep(at: number): void {
    for (const key of [...this.sent.keys()]) {
      const times = this.recent(key, at);
      if (times.length === 0) this.sent.delete(key);
      else this.sent.set(key, times);
    }
  }
}

function tooManyMails(kind: LimitedMail, waitMs: number): HttpError {
  const minutes = Math.max(1, Math.ceil(waitMs / 60_000));
  const what = kind === 'password_reset' ? 'password reset e-mails' : 'invitation e-mails';
  return new HttpError(
    429,
    'too_many_emails',
    `Too many ${what} were asked for in the last hour. Try again in ${minutes} minute${minutes === 1 ? '' : 's'}.`,
  );
}
