/** Picks the mailer: real SMTP when SMTP_URL is set, else the local fake that stores into `sent_mail`. */
import type { Config } from '../config';
import type { Clock } from '../clock';
import type { Db } from '../db/client';
import { insertSentMail } from '../db/sentMail';
import { startLocalMail } from './localSmtp';
import { createSmtpMailer, type Mailer } from './mailer';

export async function openMailer(config: Config, db: Db, clock: Clock): Promise<Mailer> {
  if (config.SMTP_URL) return createSmtpMailer(config.SMTP_URL, config.MAIL_FROM);
  return startLocalMail(config.MAIL_FROM, (mail) => insertSentMail(db, mail, clock.now()));
}
