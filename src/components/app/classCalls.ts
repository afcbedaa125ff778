/**
 * The two class calls the Classes page makes that the app's API client (`src/api/client.ts`) does
 * not offer yet: create a class and give it a new join code. Built like `labsApi` on the same
 * `Http`, so a 401 sends the user to sign-in the same way. They belong in the client beside
 * `listClasses` and `joinClass`; this file goes away when they move there.
 */
import { z } from 'zod';
import { ClassSummarySchema, type CreateClassRequest } from '@shared/api/classes';
import { createHttp } from '@/api/http';
import { SESSION_EXPIRED_EVENT } from '@/api/instance';

const http = createHttp({ onUnauthenticated: () => globalThis.dispatchEvent?.(new Event(SESSION_EXPIRED_EVENT)) });
const ClassAnswer = z.object({ class: ClassSummarySchema });

export const classCalls = {
  createClass: (body: CreateClassRequest) => http.json('/api/classes', ClassAnswer, { method: 'POST', body }).then((r) => r.class),
  newJoinCode: (classId: string) =>
    http.json(`/api/classes/${encodeURIComponent(classId)}/join-code`, ClassAnswer, { method: 'POST', body: {} }).then((r) => r.class),
};
