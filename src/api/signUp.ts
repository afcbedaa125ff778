/**
 * The typed calls of signing up with a join code: ask (answered 202 "check your e-mail" for every
 * address), then, from the mailed link, look the sign-up up and finish it with a password. All are
 * made signed out (`quiet401`). Answers are parsed with `shared/api/invitations.ts`.
 */
import { z } from 'zod';
import { SessionResponseSchema } from '@shared/api/auth';
import { SignUpAcceptedSchema, SignUpViewSchema, type FinishSignUpRequest, type SignUpRequest } from '@shared/api/invitations';
import { createHttp, type Http } from './http';

export const SIGN_UP_ENDPOINTS = {
  signUp: '/api/auth/sign-up',
  lookup: '/api/auth/sign-up/lookup',
  finish: '/api/auth/sign-up/finish',
} as const;

const ViewAnswer = z.object({ signUp: SignUpViewSchema });

export function createSignUpApi(http: Http) {
  return {
    /** Answers the message to show: the same whether or not the address has an account. */
    signUp: (body: SignUpRequest) => http.json(SIGN_UP_ENDPOINTS.signUp, SignUpAcceptedSchema, { method: 'POST', body, quiet401: true }).then((r) => r.message),
    lookup: (token: string) => http.json(SIGN_UP_ENDPOINTS.lookup, ViewAnswer, { method: 'POST', body: { token }, quiet401: true }).then((r) => r.signUp),
    /** Creates the account in its class and starts its session; answers the signed-in user. */
    finish: (body: FinishSignUpRequest) => http.json(SIGN_UP_ENDPOINTS.finish, SessionResponseSchema, { method: 'POST', body, quiet401: true }).then((r) => r.user),
  };
}

export type SignUpApi = ReturnType<typeof createSignUpApi>;

/** The app's sign-up client (signed out throughout, so a 401 never means a session ran out). */
export const signUpApi = createSignUpApi(createHttp());
