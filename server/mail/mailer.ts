/**
 * Outgoing mail over SMTP with nodemailer. Every message has a plain-text and an HTML body.
 */
import nodemailer from 'nodemailer';

/** One message to send. */
export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
  html: string;
}

/** What the server sends mail through. `kind` says whether a real SMTP server or the local fake receives it. */
export interface Mailer {
  kind: 'smtp' | 'local-fake';
  send(mail: OutgoingMail): Promise<void>;
  close(): Promise<void>;
}

/** A mailer over the SMTP server at `url` (smtp:// or smtps://). */
export function createSmtpMailer(url: string, from: string, kind: Mailer['kind'] = 'smtp'): Mailer {
  const transport = nodemailer.createTransport(url, { from });
  return {
    kind,
    async send(mail) {
      await transport.sendMail({ from, ...mail });
    },
    async close() {
      transport.close();
    },
  };
}
