/** The sent-mail table the local fake SMTP server fills. */
import { desc, ilike, or } from 'drizzle-orm';
import type { Db } from './client';
import { sentMail, type SentMailRow } from './schema';
import type { ReceivedMail } from '../mail/localSmtp';

export async function insertSentMail(db: Db, mail: ReceivedMail, receivedAt: Date): Promise<void> {
  await db.insert(sentMail).values({ ...mail, receivedAt });
}

/** Newest first; with `search`, only mail whose address, subject or text holds it (any case). */
export async function listSentMail(db: Db, limit = 200, search: string | null = null): Promise<SentMailRow[]> {
  // LIKE's own wildcards in the search are meant literally.
  const pattern = search === null ? null : `%${search.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
  const where = pattern === null ? undefined : or(ilike(sentMail.to, pattern), ilike(sentMail.from, pattern), ilike(sentMail.subject, pattern), ilike(sentMail.text, pattern));
  return db.select().from(sentMail).where(where).orderBy(desc(sentMail.receivedAt), desc(sentMail.id)).limit(limit);
}
