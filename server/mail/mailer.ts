import nodemailer from 'nodemailer';

export interface MailMessage {
  to: string | string[];
  subject: string;
  text: string;
  html?: string;
}

/** Where the app's e-mail goes. Injected into createApp so tests choose the transport. */
export interface Mailer {
  send(message: MailMessage): Promise<void>;
  close(): void;
}

export const MAIL_FROM = 'Anglebench <anglebench@localhost>';

/** A mailer over SMTP (SMTP_URL, or the local catcher's address). */
export function createSmtpMailer(url: string, from = MAIL_FROM): Mailer {
  const transport = nodemailer.createTransport(url);
  return {
    send: async (message) => {
      await transport.sendMail({ from, ...message });
    },
    close: () => transport.close(),
  };
}

/** Drops every message; the default when an app is built without a mailer and SMTP_URL. */
export const discardingMailer: Mailer = { send: async () => {}, close: () => {} };
