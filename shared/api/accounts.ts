/** A signed-in user's own account (password, sessions) and an administrator's actions on accounts. */
import { z } from 'zod';
import { AccountViewSchema, NewPasswordSchema } from './auth';

/** `POST /api/auth/password`: the current password proves it is the account's owner at the keyboard. */
export const ChangePasswordRequestSchema = z
  .object({
    currentPassword: z.string().min(1, 'enter your current password').max(200, 'a password is at most 200 characters'),
    newPassword: NewPasswordSchema,
  })
  .refine((body) => body.newPassword !== body.currentPassword, {
    path: ['newPassword'],
    message: 'is the same as the current password; choose a new one',
  });
export type ChangePasswordRequest = z.infer<typeof ChangePasswordRequestSchema>;

/** The answer to deactivating or reactivating an account: the account as it now is. */
export const AccountResponseSchema = z.object({ user: AccountViewSchema });
export type AccountResponse = z.infer<typeof AccountResponseSchema>;

/** The answer to an administrator sending a reset link: where it went and until when it works. */
export const ResetLinkSentSchema = z.object({ sent: z.object({ email: z.string(), expiresAt: z.string() }) });
export type ResetLinkSent = z.infer<typeof ResetLinkSentSchema>;
