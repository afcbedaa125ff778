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
});
export type AdminStatus = z.infer<typeof AdminStatusSchema>;
