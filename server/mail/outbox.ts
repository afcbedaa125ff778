/**
 * The mailer of an app process on a shared PostgreSQL database: each message goes into the mail
 * outbox (a queue in the database, `jobs/jobQueue.ts`) and a `npm run worker` process sends it,
 * retrying while the relay refuses. `kind` is what the workers deliver to (SMTP, or the local
 * mailbox in `sent_mail` when SMTP_URL is unset), so the admin's mailbox page works as on PGlite.
 */
import type { JobQueue } from '../jobs/jobQueue';
import type { Mailer } from './mailer';

export function outboxMailer(queue: JobQueue, kind: Mailer['kind']): Mailer {
  return {
    kind,
    send: (mail) => queue.enqueueMail(mail),
    // The queue is the process's to stop (index.ts), after the server stopped taking requests.
    close: async () => undefined,
  };
}
