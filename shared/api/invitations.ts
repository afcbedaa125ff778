/**
 * Sign-up with a join code and invitations (class and instructor): request and response bodies.
 * Neither answer ever says whether an address has an account to anyone but the holder of the
 * e-mailed link.
 */
import { z } from 'zod';
import { EmailSchema, JoinCodeSchema, NewPasswordSchema, OneTimeTokenSchema, PersonNameSchema, RoleSchema } from './auth';

/**
 * Sign-up asks for no password: the answer is the same "check your e-mail" for every address, and
 * the e-mailed link is where a new account's password is chosen.
 */
export const SignUpRequestSchema = z.object({
  joinCode: JoinCodeSchema,
  name: PersonNameSchema,
  email: EmailSchema,
});
export type SignUpRequest = z.infer<typeof SignUpRequestSchema>;

/** The 202 answer to a sign-up, the same whether or not the address has an account. */
export const SignUpAcceptedSchema = z.object({ message: z.string() });

/** A request that carries only the token of an e-mailed link. */
export const LinkTokenRequestSchema = z.object({ token: OneTimeTokenSchema });
export type LinkTokenRequest = z.infer<typeof LinkTokenRequestSchema>;

/** What a sign-up link finishes, shown before the person chooses a password. */
export const SignUpViewSchema = z.object({
  email: z.string(),
  name: z.string(),
  classId: z.string(),
  className: z.string(),
  expiresAt: z.string(),
});
export type SignUpView = z.infer<typeof SignUpViewSchema>;

export const FinishSignUpRequestSchema = z.object({
  token: OneTimeTokenSchema,
  name: PersonNameSchema,
  password: NewPasswordSchema,
});
export type FinishSignUpRequest = z.infer<typeof FinishSignUpRequestSchema>;

/**
 * What an invitation link offers. `hasAccount`: the invited address has an account already, so the
 * invitation is accepted by that account, signed in (a class invitation), not by setting a password.
 */
export const InvitationViewSchema = z.object({
  email: z.string(),
  role: RoleSchema,
  name: z.string().nullable(),
  classId: z.string().nullable(),
  className: z.string().nullable(),
  expiresAt: z.string(),
  hasAccount: z.boolean(),
});
export type InvitationView = z.infer<typeof InvitationViewSchema>;

/** Accepting an invitation to an address without an account: the new account's name and password. */
export const AcceptInvitationRequestSchema = z.object({
  token: OneTimeTokenSchema,
  name: PersonNameSchema,
  password: NewPasswordSchema,
});
export type AcceptInvitationRequest = z.infer<typeof AcceptInvitationRequestSchema>;
