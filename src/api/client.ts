/**
 * The typed API: one function per server route, each parsing its answer with the shared schema.
 * Views call these through @tanstack/vue-query (see `queries.ts`); tests call them with a fake fetch.
 */
import { z } from 'zod';
// From the schemas' own files, not the `@shared/api` index: the app's first module then builds
// only these schemas at start, not the labs' and the others' (zod builds a schema when its module runs).
import { PasswordResetAcceptedSchema, SessionResponseSchema, UserListSchema, type SignInRequest } from '@shared/api/auth';
import { ClassListSchema } from '@shared/api/classes';
import {
  DiffResponseSchema,
  ImportResponseSchema,
  ProgramDetailSchema,
  ProgramListSchema,
  ProgramSummarySchema,
  VersionDetailSchema,
  VersionListSchema,
  type CreateProgramRequest,
  type RestoreVersionRequest,
  type SaveVersionRequest,
} from '@shared/api/programs';
import { ENDPOINTS } from './endpoints';
import type { Http } from './http';

const Anything = z.unknown();
/** Version routes answer `{ version }`. */
const VersionAnswer = z.object({ version: VersionDetailSchema });

export function createApi(http: Http) {
  return {
    me: () => http.json(ENDPOINTS.me, SessionResponseSchema, { quiet401: true }),
    signIn: (body: SignInRequest) => http.json(ENDPOINTS.signIn, SessionResponseSchema, { method: 'POST', body, quiet401: true }),
    // A JSON body, even empty: the server refuses a POST whose body has no JSON type (a browser sends Content-Length: 0).
    signOut: () => http.raw(ENDPOINTS.signOut, { method: 'POST', quiet401: true }).then(() => undefined),
    requestPasswordReset: (email: string) =>
      http.json(ENDPOINTS.passwordReset, PasswordResetAcceptedSchema, { method: 'POST', body: { email }, quiet401: true }),
    confirmPasswordReset: (token: string, password: string) =>
      http.raw(ENDPOINTS.passwordResetConfirm, { method: 'POST', body: { token, password }, quiet401: true }).then(() => undefined),

    listPrograms: () => http.json(ENDPOINTS.programs, ProgramListSchema).then((r) => r.programs),
    createProgram: (body: CreateProgramRequest) => http.json(ENDPOINTS.programs, ProgramDetailSchema, { method: 'POST', body }),
    getProgram: (id: string) => http.json(ENDPOINTS.program(id), ProgramDetailSchema),
    renameProgram: (id: string, title: string) =>
      http.json(ENDPOINTS.program(id), z.object({ program: ProgramSummarySchema }), { method: 'PATCH', body: { title } }).then((r) => r.program),
    deleteProgram: (id: string) => http.raw(ENDPOINTS.program(id), { method: 'DELETE' }).then(() => undefined),
    saveVersion: (id: string, body: SaveVersionRequest) =>
      http.json(ENDPOINTS.versions(id), VersionAnswer, { method: 'POST', body }).then((r) => r.version),
    listVersions: (id: string) => http.json(ENDPOINTS.versions(id), VersionListSchema).then((r) => r.versions),
    getVersion: (id: string, n: number) => http.json(ENDPOINTS.version(id, n), VersionAnswer).then((r) => r.version),
    diffVersions: (id: string, from: number, to: number) => http.json(ENDPOINTS.diff(id, from, to), DiffResponseSchema),
    restoreVersion: (id: string, body: RestoreVersionRequest) =>
      http.json(ENDPOINTS.restore(id), VersionAnswer, { method: 'POST', body }).then((r) => r.version),
    exportVersion: (id: string, n: number, format: 'json' | 'plcopen') => http.raw(ENDPOINTS.exportVersion(id, n, format)),
    importProgram: (file: File) => {
      const form = new FormData();
      form.append('file', file);
      return http.json(ENDPOINTS.programImport, ImportResponseSchema, { method: 'POST', form });
    },

    listClasses: () => http.json(ENDPOINTS.classes, ClassListSchema).then((r) => r.classes),
    joinClass: (joinCode: string) => http.json(ENDPOINTS.joinClass, Anything, { method: 'POST', body: { joinCode } }),
    listUsers: () => http.json(ENDPOINTS.users, UserListSchema).then((r) => r.users),
  };
}

export type Api = ReturnType<typeof createApi>;
