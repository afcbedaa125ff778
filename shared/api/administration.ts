/**
 * The admin console beyond the account list: role changes, usage, invitations (resend, cancel).
 * Usage is counts only: admins keep the installation running and read no student work.
 */
import { z } from 'zod';
import { RoleSchema } from './auth';

/** `POST /api/admin/users/:id/role`. */
export const ChangeRoleRequestSchema = z.strictObject({ role: RoleSchema });
export type ChangeRoleRequest = z.infer<typeof ChangeRoleRequestSchema>;

/** `GET /api/admin/usage`: active students in the last 7 days, and submissions per day for 14 days (UTC days). */
export const UsageSchema = z.object({
  activeStudentsThisWeek: z.number().int(),
  students: z.number().int(),
  instructors: z.number().int(),
  classes: z.number().int(),
  submissionsPerDay: z.array(z.object({ day: z.string(), count: z.number().int() })),
});
export type Usage = z.infer<typeof UsageSchema>;

export type InvitationState = 'open' | 'used' | 'expired' | 'cancelled';
/** One invitation as the admin console and the roster list it. */
export const InvitationEntrySchema = z.object({
  id: z.string(),
  email: z.string(),
  name: z.string().nullable(),
  role: RoleSchema,
  classId: z.string().nullable(),
  className: z.string().nullable(),
  state: z.enum(['open', 'used', 'expired', 'cancelled']),
  createdAt: z.string(),
  expiresAt: z.string(),
});
export type InvitationEntry = z.infer<typeof InvitationEntrySchema>;
export const InvitationEntryListSchema = z.object({ invitations: z.array(InvitationEntrySchema) });
export const InvitationEntryResponseSchema = z.object({ invitation: InvitationEntrySchema });

/** `GET /api/dev/mail?q=`: part of the address, subject or text, any case. */
export const MailSearchQuerySchema = z.object({ q: z.string().max(200, 'a search is at most 200 characters').optional() });
