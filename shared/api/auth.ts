/** Accounts and sessions: request and response bodies. */
import { z } from 'zod';

export const RoleSchema = z.enum(['student', 'instructor', 'admin']);
export type Role = z.infer<typeof RoleSchema>;

/** An e-mail address, trimmed; compared without regard to case on the server. */
export const EmailSchema = z.string().trim().max(254, 'an e-mail address is at most 254 characters').pipe(z.email('not a valid e-mail address'));

/** At least 10 characters (NIST SP 800-63B section 3.1.1.2 asks for at least 8; 10 here) [memory]. */
export const NewPasswordSchema = z
  .string()
  .min(10, 'a password needs at least 10 characters')
  .max(200, 'a password is at most 200 characters');

export const PersonNameSchema = z.string().trim().min(1, 'a name is needed').max(100, 'a name is at most 100 characters');

/** A join code as typed: case and surrounding spaces do not matter. */
export const JoinCodeSchema = z
  .string()
  .trim()
  .toUpperCase()
  .regex(/^[A-Z0-9-]{4,32}$/, 'a join code is 4 to 32 letters, digits or "-"');

/** A user as the API shows them. Dates are ISO strings. */
export const UserViewSchema = z.object({
  id: z.string(),
  email: z.string(),
  name: z.string(),
  role: RoleSchema,
  demo: z.boolean(),
  createdAt: z.string(),
  lastSignInAt: z.string().nullable(),
});
export type UserView = z.infer<typeof UserViewSchema>;

export const SignInRequestSchema = z.object({
  email: EmailSchema,
  password: z.string().min(1, 'enter your password').max(200),
});
export type SignInRequest = z.infer<typeof SignInRequestSchema>;

/** `GET /api/me`, and the answer to sign-in, finishing a sign-up and accepting an invitation. */
export const SessionResponseSchema = z.object({ user: UserViewSchema });
export type SessionResponse = z.infer<typeof SessionResponseSchema>;

export const PasswordResetRequestSchema = z.object({ email: EmailSchema });
export type PasswordResetRequest = z.infer<typeof PasswordResetRequestSchema>;

/** A one-time token from an e-mailed link (sent in bodies, never in URLs, so it stays out of logs). */
export const OneTimeTokenSchema = z.string().trim().regex(/^[A-Za-z0-9_-]{20,100}$/, 'this link is not valid; ask for a new one');

export const PasswordResetConfirmSchema = z.object({ token: OneTimeTokenSchema, password: NewPasswordSchema });
export type PasswordResetConfirm = z.infer<typeof PasswordResetConfirmSchema>;

/** The same answer whether or not the address has an account. */
export const PasswordResetAcceptedSchema = z.object({ message: z.string() });

/** Admin: invite an instructor by e-mail. */
export const InviteInstructorRequestSchema = z.object({ email: EmailSchema, name: PersonNameSchema.optional() });
export type InviteInstructorRequest = z.infer<typeof InviteInstructorRequestSchema>;

export const InvitationSentSchema = z.object({ email: z.string(), role: RoleSchema, expiresAt: z.string() });
export type InvitationSent = z.infer<typeof InvitationSentSchema>;

/** A user as an administrator sees them: with whether the account is deactivated (and since when). */
export const AccountViewSchema = UserViewSchema.extend({ deactivatedAt: z.string().nullable() });
export type AccountView = z.infer<typeof AccountViewSchema>;

export const UserListSchema = z.object({ users: z.array(AccountViewSchema) });
