/** `GET /api/admin/status` (admin only): what an administrator should know about the installation. */
import { z } from 'zod';
import { RoleSchema } from './auth';

/** A demo account that can still sign in: its password is published, so it is a way in. */
export const DemoAccountViewSchema = z.object({
  email: z.string(),
  name: z.string(),
  role: RoleSchema,
});
export type DemoAccountView = z.infer<typeof DemoAccountViewSchema>;

export const AdminStatusSchema = z.object({
  /** Demo accounts that are not deactivated, admins first; empty on a real install. */
  demoAccounts: z.array(DemoAccountViewSchema),
  /** `local`: mail goes to the local mailbox (SMTP_URL unset), which the console shows; `smtp`: to a real relay. */
  mailbox: z.enum(['local', 'smtp']),
  /** Whether `GET /api/admin/backup` can dump the database (PGlite); a PostgreSQL server is backed up there. */
  backup: z.boolean(),
});
export type AdminStatus = z.infer<typeof AdminStatusSchema>;
