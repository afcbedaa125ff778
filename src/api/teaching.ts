/**
 * The typed calls of the instructor's week: the class overview, a lab's students, "return all
 * graded", similar submissions. Each answer is parsed with its shared schema
 * (`shared/api/teaching.ts`); paths live in `TEACHING_ENDPOINTS` only.
 */
import {
  ClassOverviewSchema,
  LabStudentListSchema,
  ReturnGradedResponseSchema,
  SideBySideSchema,
  SimilarListSchema,
} from '@shared/api/teaching';
import { createHttp, type Http } from './http';
import { SESSION_EXPIRED_EVENT } from './instance';

const enc = encodeURIComponent;

export const TEACHING_ENDPOINTS = {
  overview: (classId: string) => `/api/classes/${enc(classId)}/overview`,
  labStudents: (labId: string) => `/api/labs/${enc(labId)}/students`,
  returnGraded: (labId: string) => `/api/labs/${enc(labId)}/return-graded`,
  similar: (labId: string) => `/api/labs/${enc(labId)}/similar`,
  pair: (labId: string, a: string, b: string) => `/api/labs/${enc(labId)}/similar/pair?a=${enc(a)}&b=${enc(b)}`,
} as const;

export function createTeachingApi(http: Http) {
  return {
    overview: (classId: string) => http.json(TEACHING_ENDPOINTS.overview(classId), ClassOverviewSchema),
    labStudents: (labId: string) => http.json(TEACHING_ENDPOINTS.labStudents(labId), LabStudentListSchema).then((r) => r.students),
    /** A POST always sends a JSON body; the note is left out when blank. */
    returnGraded: (labId: string, note: string) =>
      http.json(TEACHING_ENDPOINTS.returnGraded(labId), ReturnGradedResponseSchema, { method: 'POST', body: note.trim() ? { note: note.trim() } : {} }).then((r) => r.returned),
    similar: (labId: string) => http.json(TEACHING_ENDPOINTS.similar(labId), SimilarListSchema),
    pair: (labId: string, a: string, b: string) => http.json(TEACHING_ENDPOINTS.pair(labId, a, b), SideBySideSchema),
  };
}

export const teachingApi = createTeachingApi(
  createHttp({
    onUnauthenticated: () => globalThis.dispatchEvent?.(new Event(SESSION_EXPIRED_EVENT)),
  }),
);

/** Cache keys, under the class's and the lab's keys so their invalidations reach these too. */
export const teachingKeys = {
  overview: (classId: string) => ['classes', classId, 'overview'] as const,
  labStudents: (labId: string) => ['labs', labId, 'submissions', 'students'] as const,
  similar: (labId: string) => ['labs', labId, 'submissions', 'similar'] as const,
  pair: (labId: string, a: string, b: string) => ['labs', labId, 'submissions', 'similar', a, b] as const,
};
