/**
 * The typed calls of the labs screens: labs, templates, attachments, self-check, submissions,
 * review and the gradebook. Each answer is parsed with the shared schema of its route
 * (`shared/api/labs.ts`); paths live in `LAB_ENDPOINTS` only. Built on the same `Http` as the
 * rest of the client, so a 401 sends the user to sign-in the same way. A POST always sends a JSON
 * body (`{}` when there is nothing to say): the server refuses untyped bodies.
 */
import { z } from 'zod';
import {
  AttachmentSummarySchema,
  FromTemplateResponseSchema,
  GradebookSchema,
  LabDetailResponseSchema,
  LabListSchema,
  LabTemplateListSchema,
  OpenLabResponseSchema,
  RegradeResponseSchema,
  SelfCheckScriptSchema,
  StudentSubmissionListSchema,
  StudentSubmissionResponseSchema,
  SubmissionDetailResponseSchema,
  SubmissionRowListSchema,
  TryLabResponseSchema,
  type CreateLabRequest,
  type OverrideScoreRequest,
  type ProgramVersionRef,
  type UpdateLabRequest,
} from '@shared/api/labs';
import { createHttp, type Http } from './http';
import { SESSION_EXPIRED_EVENT } from './instance';

const enc = encodeURIComponent;

/** Every labs route the client calls (see `server/routes/`). */
export const LAB_ENDPOINTS = {
  classLabs: (classId: string) => `/api/classes/${enc(classId)}/labs`,
  fromTemplate: (classId: string) => `/api/classes/${enc(classId)}/labs/from-template`,
  templates: '/api/lab-templates',
  lab: (id: string) => `/api/labs/${enc(id)}`,
  publish: (id: string) => `/api/labs/${enc(id)}/publish`,
  unpublish: (id: string) => `/api/labs/${enc(id)}/unpublish`,
  tryLab: (id: string) => `/api/labs/${enc(id)}/try`,
  attachments: (id: string) => `/api/labs/${enc(id)}/attachments`,
  attachment: (labId: string, attachmentId: string) => `/api/labs/${enc(labId)}/attachments/${enc(attachmentId)}`,
  open: (id: string) => `/api/labs/${enc(id)}/open`,
  selfCheckScript: (id: string) => `/api/labs/${enc(id)}/self-check-script`,
  submissions: (id: string) => `/api/labs/${enc(id)}/submissions`,
  mySubmissions: (id: string) => `/api/labs/${enc(id)}/submissions/mine`,
  regrade: (id: string) => `/api/labs/${enc(id)}/regrade`,
  submission: (id: string) => `/api/submissions/${enc(id)}`,
  override: (id: string) => `/api/submissions/${enc(id)}/override`,
  feedback: (id: string) => `/api/submissions/${enc(id)}/feedback`,
  returnSubmission: (id: string) => `/api/submissions/${enc(id)}/return`,
  gradebook: (classId: string) => `/api/classes/${enc(classId)}/gradebook`,
  gradebookCsv: (classId: string) => `/api/classes/${enc(classId)}/gradebook.csv`,
} as const;

/** Query of the submissions table; sorting and filtering are the table's own, in the browser. */
export interface SubmissionQuery {
  latest?: boolean;
}

const AttachmentAnswer = z.object({ attachment: AttachmentSummarySchema });

export function createLabsApi(http: Http) {
  const labOf = (r: z.infer<typeof LabDetailResponseSchema>) => r.lab;
  return {
    listClassLabs: (classId: string) => http.json(LAB_ENDPOINTS.classLabs(classId), LabListSchema).then((r) => r.labs),
    createLab: (classId: string, body: CreateLabRequest) =>
      http.json(LAB_ENDPOINTS.classLabs(classId), LabDetailResponseSchema, { method: 'POST', body }).then(labOf),
    listTemplates: () => http.json(LAB_ENDPOINTS.templates, LabTemplateListSchema).then((r) => r.templates),
    fromTemplate: (classId: string, templateId: string) =>
      http.json(LAB_ENDPOINTS.fromTemplate(classId), FromTemplateResponseSchema, { method: 'POST', body: { templateId } }),
    getLab: (id: string) => http.json(LAB_ENDPOINTS.lab(id), LabDetailResponseSchema).then(labOf),
    updateLab: (id: string, body: UpdateLabRequest) => http.json(LAB_ENDPOINTS.lab(id), LabDetailResponseSchema, { method: 'PATCH', body }).then(labOf),
    deleteLab: (id: string) => http.raw(LAB_ENDPOINTS.lab(id), { method: 'DELETE' }).then(() => undefined),
    publish: (id: string) => http.json(LAB_ENDPOINTS.publish(id), LabDetailResponseSchema, { method: 'POST', body: {} }).then(labOf),
    unpublish: (id: string) => http.json(LAB_ENDPOINTS.unpublish(id), LabDetailResponseSchema, { method: 'POST', body: {} }).then(labOf),
    tryLab: (id: string, ref: ProgramVersionRef) => http.json(LAB_ENDPOINTS.tryLab(id), TryLabResponseSchema, { method: 'POST', body: ref }).then((r) => r.report),
    uploadAttachment: (id: string, file: File) => {
      const form = new FormData();
      form.append('file', file);
      return http.json(LAB_ENDPOINTS.attachments(id), AttachmentAnswer, { method: 'POST', form }).then((r) => r.attachment);
    },
    deleteAttachment: (labId: string, attachmentId: string) =>
      http.raw(LAB_ENDPOINTS.attachment(labId, attachmentId), { method: 'DELETE' }).then(() => undefined),

    openLab: (id: string) => http.json(LAB_ENDPOINTS.open(id), OpenLabResponseSchema, { method: 'POST', body: {} }),
    selfCheckScript: (id: string) => http.json(LAB_ENDPOINTS.selfCheckScript(id), SelfCheckScriptSchema),
    submit: (id: string, ref: ProgramVersionRef) =>
      http.json(LAB_ENDPOINTS.submissions(id), StudentSubmissionResponseSchema, { method: 'POST', body: ref }).then((r) => r.submission),
    mySubmissions: (id: string) => http.json(LAB_ENDPOINTS.mySubmissions(id), StudentSubmissionListSchema).then((r) => r.submissions),

    listSubmissions: (id: string, query: SubmissionQuery = {}) =>
      http
        .json(`${LAB_ENDPOINTS.submissions(id)}${query.latest ? '?latest=true' : ''}`, SubmissionRowListSchema)
        .then((r) => r.submissions),
    regrade: (id: string) => http.json(LAB_ENDPOINTS.regrade(id), RegradeResponseSchema, { method: 'POST', body: {} }),
    getSubmission: (id: string) => http.json(LAB_ENDPOINTS.submission(id), SubmissionDetailResponseSchema).then((r) => r.submission),
    overrideScore: (id: string, body: OverrideScoreRequest) =>
      http.json(LAB_ENDPOINTS.override(id), SubmissionDetailResponseSchema, { method: 'POST', body }).then((r) => r.submission),
    saveFeedback: (id: string, feedback: string) =>
      http.json(LAB_ENDPOINTS.feedback(id), SubmissionDetailResponseSchema, { method: 'PUT', body: { feedback } }).then((r) => r.submission),
    returnSubmission: (id: string, feedback?: string) =>
      http
        .json(LAB_ENDPOINTS.returnSubmission(id), SubmissionDetailResponseSchema, { method: 'POST', body: feedback === undefined ? {} : { feedback } })
        .then((r) => r.submission),

    gradebook: (classId: string) => http.json(LAB_ENDPOINTS.gradebook(classId), GradebookSchema),
    gradebookCsv: (classId: string) => http.raw(LAB_ENDPOINTS.gradebookCsv(classId)).then((r) => r.text()),
  };
}

export type LabsApi = ReturnType<typeof createLabsApi>;

/** The app's labs client. */
export const labsApi = createLabsApi(
  createHttp({
    onUnauthenticated: () => globalThis.dispatchEvent?.(new Event(SESSION_EXPIRED_EVENT)),
  }),
);

/** Cache keys of the labs screens. */
export const labKeys = {
  classLabs: (classId: string) => ['classes', classId, 'labs'] as const,
  templates: ['lab-templates'] as const,
  lab: (id: string) => ['labs', id] as const,
  selfCheck: (id: string) => ['labs', id, 'self-check'] as const,
  mySubmissions: (id: string) => ['labs', id, 'submissions', 'mine'] as const,
  submissions: (id: string) => ['labs', id, 'submissions'] as const,
  submission: (id: string) => ['submissions', id] as const,
  gradebook: (classId: string) => ['classes', classId, 'gradebook'] as const,
};
