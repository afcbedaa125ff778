/**
 * Every route the client calls, in one table, so a path lives in exactly one place on this side.
 * They follow the server's routes under `server/routes/`.
 */
const enc = encodeURIComponent;

export const ENDPOINTS = {
  me: '/api/me',
  signIn: '/api/auth/sign-in',
  signOut: '/api/auth/sign-out',
  passwordReset: '/api/auth/password-reset',
  passwordResetConfirm: '/api/auth/password-reset/confirm',
  programs: '/api/programs',
  programImport: '/api/programs/import',
  program: (id: string) => `/api/programs/${enc(id)}`,
  versions: (id: string) => `/api/programs/${enc(id)}/versions`,
  version: (id: string, n: number) => `/api/programs/${enc(id)}/versions/${n}`,
  diff: (id: string, from: number, to: number) => `/api/programs/${enc(id)}/diff?from=${from}&to=${to}`,
  restore: (id: string) => `/api/programs/${enc(id)}/restore`,
  exportVersion: (id: string, n: number, format: 'json' | 'plcopen') => `/api/programs/${enc(id)}/versions/${n}/export?format=${format}`,
  classes: '/api/classes',
  joinClass: '/api/classes/join',
  users: '/api/admin/users',
} as const;
