/**
 * The typed calls of the class screens: create a class, a new join code, the roster (students,
 * pending invitations, CSV upload, inviting one student) and removing a student. Each answer is parsed with the shared
 * schema of its route (`shared/api/classes.ts`); paths live in `CLASS_ENDPOINTS` only. Built on the
 * same `Http` as the rest of the client, so a 401 sends the user to sign-in the same way.
 */
import { z } from 'zod';
import {
  ClassInvitationSentSchema,
  ClassSummarySchema,
  InvitationListSchema,
  RosterReportSchema,
  StudentListSchema,
  type CreateClassRequest,
  type InviteStudentRequest,
} from '@shared/api/classes';
import { createHttp, type Http } from './http';
import { SESSION_EXPIRED_EVENT } from './instance';

const enc = encodeURIComponent;

/** The class routes the client calls here (see `server/routes/classes.ts` and `uploads.ts`). */
export const CLASS_ENDPOINTS = {
  classes: '/api/classes',
  joinCode: (classId: string) => `/api/classes/${enc(classId)}/join-code`,
  students: (classId: string) => `/api/classes/${enc(classId)}/students`,
  student: (classId: string, userId: string) => `/api/classes/${enc(classId)}/students/${enc(userId)}`,
  invitations: (classId: string) => `/api/classes/${enc(classId)}/invitations`,
  roster: (classId: string) => `/api/classes/${enc(classId)}/roster`,
} as const;

const ClassAnswer = z.object({ class: ClassSummarySchema });
const RosterAnswer = z.object({ report: RosterReportSchema });
const InvitationAnswer = z.object({ invitation: ClassInvitationSentSchema });

export function createClassesApi(http: Http) {
  return {
    createClass: (body: CreateClassRequest) => http.json(CLASS_ENDPOINTS.classes, ClassAnswer, { method: 'POST', body }).then((r) => r.class),
    /** A POST always sends a JSON body: the server refuses untyped bodies. */
    newJoinCode: (classId: string) => http.json(CLASS_ENDPOINTS.joinCode(classId), ClassAnswer, { method: 'POST', body: {} }).then((r) => r.class),
    listStudents: (classId: string) => http.json(CLASS_ENDPOINTS.students(classId), StudentListSchema).then((r) => r.students),
    removeStudent: (classId: string, userId: string) => http.raw(CLASS_ENDPOINTS.student(classId, userId), { method: 'DELETE' }).then(() => undefined),
    /** Every invitation of the class, used and expired ones too (`unacceptedInvitations` keeps those not accepted). */
    listInvitations: (classId: string) => http.json(CLASS_ENDPOINTS.invitations(classId), InvitationListSchema).then((r) => r.invitations),
    /** Invites one student; an open invitation to the same address is replaced (this sends it again). */
    inviteStudent: (classId: string, body: InviteStudentRequest) =>
      http.json(CLASS_ENDPOINTS.invitations(classId), InvitationAnswer, { method: 'POST', body }).then((r) => r.invitation),
    uploadRoster: (classId: string, file: File) => {
      const form = new FormData();
      form.append('file', file);
      return http.json(CLASS_ENDPOINTS.roster(classId), RosterAnswer, { method: 'POST', form }).then((r) => r.report);
    },
  };
}

export type ClassesApi = ReturnType<typeof createClassesApi>;

/** The app's classes client. */
export const classesApi = createClassesApi(
  createHttp({
    onUnauthenticated: () => globalThis.dispatchEvent?.(new Event(SESSION_EXPIRED_EVENT)),
  }),
);

/** Cache keys of the roster screen (under the class, so dropping `['classes']` drops them too). */
export const classKeys = {
  students: (classId: string) => ['classes', classId, 'students'] as const,
  invitations: (classId: string) => ['classes', classId, 'invitations'] as const,
};
