/** The sent-mail table the local fake SMTP server fills. */
import { desc } from 'drizzle-orm';
import type { Db } from './client';
import { sentMail, type SentMailRow } from './schema';
import type { ReceivedMail } from '../mail/localSmtp';

export async function insertSentMail(db: Db, mail: ReceivedMail, receivedAt: Date): Promise<void> {
  await db.insert(sentMail).values({ ...mail, receivedAt });
}

/** Newest first. */
export async function listSentMail(db: Db, limit = 200): Promise<SentMailRow[]> {
  return db.select().from(sentMail).orderBy(desc(sentMail.receivedAt), desc(sentMail.id)).limit(limit);
}
