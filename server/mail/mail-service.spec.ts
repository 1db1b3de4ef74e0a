import { once } from 'node:events';
import type { AddressInfo } from 'node:net';
import { createRequire } from 'node:module';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createLogger } from '../logger';
import { createTestApp, type TestApp } from '../testing/test-app';
import { MailService } from './mail-service';
import { renderMail } from './mail-template';
import { OutboxRepository } from './outbox-repository';

/** The parts of smtp-server (no type declarations) this spec uses. */
interface SmtpServer {
  listen(port: number, host: string): void;
  close(done: () => void): void;
  server: { address(): AddressInfo; on(event: string, listener: () => void): void };
}
type SmtpServerClass = new (options: {
  authOptional: boolean;
  disabledCommands: string[];
  onData(stream: NodeJS.ReadableStream, session: unknown, done: () => void): void;
}) => SmtpServer;
const { SMTPServer } = createRequire(import.meta.url)('smtp-server') as {
  SMTPServer: SmtpServerClass;
};

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ seed: false });
});
afterAll(async () => {
  await t.close();
});

const CONTENT = {
  subject: 'Hello <there>',
  greeting: 'Hello Ada,',
  blocks: [{ text: 'Fish & chips' }, { link: 'http://localhost/x?a=1&b=2', label: 'Open' }],
};

describe('renderMail', () => {
  it('brands the message, keeps a readable text part and escapes the HTML part', () => {
    const mail = renderMail(CONTENT);
    expect(mail.text).toBe(
      'Hello Ada,\n\nFish & chips\n\nOpen:\nhttp://localhost/x?a=1&b=2\n\n-- \n' +
        'Tensile · drills, assignments and practice for drum-set students\n',
    );
    expect(mail.html).toContain('>Tensile</p>');
    expect(mail.html).toContain('Fish &#38; chips');
    expect(mail.html).toContain('href="http://localhost/x?a=1&#38;b=2"');
    expect(mail.html).not.toMatch(/<img|src=|url\(/i);
  });
});

describe('MailService', () => {
  it('stores messages in the outbox table without SMTP_URL', async () => {
    const outbox = new OutboxRepository(t.db);
    const mailer = new MailService(
      { smtpUrl: undefined, publicUrl: 'http://localhost:8080', outbox },
      createLogger('silent'),
    );
    await mailer.send('Ada@Larkspur.test', CONTENT);
    const page = await outbox.list({ page: 0, pageSize: 5 });
    const stored = await outbox.find(page.items[0]!.id);
    expect(stored).toMatchObject({ to: 'ada@larkspur.test', subject: 'Hello <there>' });
    expect(stored?.text).toContain('Fish & chips');
    expect(stored?.html).toContain('Fish &#38; chips');
  });

  it('sends through the SMTP server named by SMTP_URL, with text and HTML parts', async () => {
    const received: string[] = [];
    const server = new SMTPServer({
      authOptional: true,
      disabledCommands: ['STARTTLS'],
      onData(stream, _session, done) {
        const chunks: Buffer[] = [];
        stream.on('data', (chunk: Buffer) => chunks.push(chunk));
        stream.on('end', () => {
          received.push(Buffer.concat(chunks).toString('utf8'));
          done();
        });
      },
    });
    server.listen(0, '127.0.0.1');
    await once(server.server as unknown as NodeJS.EventEmitter, 'listening');
    const { port } = server.server.address();
    try {
      const mailer = new MailService(
        {
          smtpUrl: `smtp://127.0.0.1:${port}`,
          publicUrl: 'http://localhost:8080',
          outbox: new OutboxRepository(t.db),
        },
        createLogger('silent'),
      );
      await mailer.send('bo@larkspur.test', CONTENT);
      expect(received).toHaveLength(1);
      expect(received[0]).toMatch(/^To: bo@larkspur\.test/m);
      expect(received[0]).toMatch(/^From: Tensile <no-reply@localhost>/m);
      expect(received[0]).toContain('text/plain');
      expect(received[0]).toContain('text/html');
      // Not also stored: the outbox is for when no server is set.
      expect(await t.db('outbox').where({ to: 'bo@larkspur.test' }).first()).toBeUndefined();
      expect(await mailer.trySend('bo@larkspur.test', CONTENT)).toBe(true);
    } finally {
      await new Promise<void>((resolve) => server.close(resolve));
    }
  });

  it('reports a failed send as false from trySend, and rejects from send', async () => {
    const mailer = new MailService(
      {
        smtpUrl: 'smtp://127.0.0.1:1',
        publicUrl: 'http://localhost:8080',
        outbox: new OutboxRepository(t.db),
      },
      createLogger('silent'),
    );
    await expect(mailer.send('x@larkspur.test', CONTENT)).rejects.toThrow();
    expect(await mailer.trySend('x@larkspur.test', CONTENT)).toBe(false);
  });
});
