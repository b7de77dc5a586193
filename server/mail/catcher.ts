import type { AddressInfo } from 'node:net';
import { simpleParser, type AddressObject } from 'mailparser';
import type { Sequelize } from 'sequelize';
import { SMTPServer } from 'smtp-server';
import { initModels, OutboxMessage } from '../db/models';

export interface MailCatcher {
  /** smtp://127.0.0.1:<port>, for createSmtpMailer. */
  url: string;
  close(): Promise<void>;
}

const addresses = (a: AddressObject | AddressObject[] | undefined) => (Array.isArray(a) ? a.map((x) => x.text).join(', ') : (a?.text ?? ''));

/**
 * The local SMTP catcher used when SMTP_URL is not set: it listens on a free loopback port,
 * accepts any message without authentication and stores it in the outbox table. The reply to the
 * client waits until the row is written, so a message is readable once sendMail resolves.
 */
export async function startMailCatcher(db: Sequelize, maxBytes = 10 * 1024 * 1024): Promise<MailCatcher> {
  initModels(db);
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    logger: false,
    size: maxBytes,
    onData(stream, _session, callback) {
      simpleParser(stream)
        .then((mail) =>
          OutboxMessage.create({
            to: addresses(mail.to),
            from: addresses(mail.from),
            subject: mail.subject ?? '',
            text: mail.text ?? '',
            html: typeof mail.html === 'string' ? mail.html : null,
            receivedAt: new Date(),
          }),
        )
        .then(() => callback(), (err: Error) => callback(err));
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => resolve());
  });
  const { port } = server.server.address() as AddressInfo;
  return {
    url: `smtp://127.0.0.1:${port}`,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
