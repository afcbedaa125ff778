/**
 * The local fake SMTP server used when SMTP_URL is unset: smtp-server on loopback and a random port,
 * each message parsed with mailparser and handed to `onMail` (the server stores it in `sent_mail`).
 */
import { SMTPServer } from 'smtp-server';
import { simpleParser } from 'mailparser';
import type { AddressObject } from 'mailparser';
import type { AddressInfo } from 'node:net';
import { createSmtpMailer, type Mailer } from './mailer';

/** A received message, as stored. */
export interface ReceivedMail {
  from: string;
  to: string;
  subject: string;
  text: string;
  html: string;
}

function addresses(value: AddressObject | AddressObject[] | undefined): string {
  if (!value) return '';
  return (Array.isArray(value) ? value : [value]).map((a) => a.text).join(', ');
}

/** Starts the fake server and returns a mailer that sends to it; `close()` stops both. */
export async function startLocalMail(from: string, onMail: (mail: ReceivedMail) => Promise<void>): Promise<Mailer> {
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    logger: false,
    size: 5 * 1024 * 1024,
    onData(stream, _session, callback) {
      simpleParser(stream)
        .then((parsed) =>
          onMail({
            from: addresses(parsed.from),
            to: addresses(parsed.to),
            subject: parsed.subject ?? '',
            text: parsed.text ?? '',
            html: typeof parsed.html === 'string' ? parsed.html : '',
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
  const smtp = createSmtpMailer(`smtp://127.0.0.1:${port}?ignoreTLS=true`, from, 'local-fake');
  return {
    kind: 'local-fake',
    send: (mail) => smtp.send(mail),
    async close() {
      await smtp.close();
      await new Promise<void>((resolve) => server.close(() => resolve()));
    },
  };
}
