/** Reads the local fake SMTP server's mailbox through `GET /api/dev/mail`, waiting for a message to arrive. */
import type { TestApp } from './testApp';
import { call } from './fixtures';

export interface Mail {
  to: string;
  subject: string;
  text: string;
  html: string;
}

/** The first mail to `to` (whose subject contains `subject`, when given) once it has arrived. */
export async function waitForMail(t: TestApp, adminCookie: string, to: string, subject = '', timeoutMs = 5000): Promise<Mail> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    const res = await call(t, 'get', '/api/dev/mail', adminCookie);
    const found = (res.body.mail as Mail[] | undefined)?.find((m) => m.to.toLowerCase().includes(to.toLowerCase()) && m.subject.includes(subject));
    if (found) return found;
    await new Promise((r) => setTimeout(r, 50));
  }
  throw new Error(`no mail to ${to}${subject ? ` about "${subject}"` : ''} arrived within ${timeoutMs} ms`);
}

/** The one-time token in a mailed link (`…#token=<token>`). */
export function tokenIn(mail: Mail): string {
  const match = /#token=([A-Za-z0-9_-]+)/.exec(mail.text);
  if (!match) throw new Error(`no token link in: ${mail.text}`);
  return match[1];
}
