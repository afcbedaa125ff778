/** Reads the local fake SMTP server's mailbox through `GET /api/dev/mail`, waiting for a message to arrive. */
import type { TestApp } from './testApp';
import { call } from './fixtures';

export interface Mail {
  to: string;
  subject: string;
  text: string;
  html: string;
}

export async function waitForMail(t: TestApp, adminCookie: string, to: string, timeoutMs = 5000): Promise<Mail> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    const res = await call(t, 'get', '/api/dev/mail', adminCookie);
    const found = (res.body.mail as Mail[] | undefined)?.find((m) => m.to.toLowerCase().includes(to.toLowerCase()));
    if (found) return found;
    await new Promise((r) => setTimeout(r, 50));
  }
  throw new Error(`no mail to ${to} arrived within ${timeoutMs} ms`);
}

/** The one-time token in a mailed link (`…#token=<token>`). */
export function tokenIn(mail: Mail): string {
  const match = /#token=([A-Za-z0-9_-]+)/.exec(mail.text);
  if (!match) throw new Error(`no token link in: ${mail.text}`);
  return match[1];
}
