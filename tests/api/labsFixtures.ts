/** Shared steps of the lab tests: a lab from a template, a student's save and submit. */
import { expect } from 'vitest';
import type { TestApp } from './helpers/testApp';
import { call, type Person } from './helpers/fixtures';

export async function labFromTemplate(t: TestApp, instructor: Person, classId: string, templateId: string, extra: Record<string, unknown> = {}): Promise<{ labId: string; solutionId: string }> {
  const res = await call(t, 'post', `/api/classes/${classId}/labs/from-template`, instructor.cookie).send({ templateId, ...extra });
  expect(res.status, res.text).toBe(201);
  return { labId: res.body.lab.id, solutionId: res.body.solution.id };
}

export async function publish(t: TestApp, instructor: Person, labId: string): Promise<void> {
  const res = await call(t, 'post', `/api/labs/${labId}/publish`, instructor.cookie).send({});
  expect(res.status, res.text).toBe(200);
}

/** Opens the lab as the student, saves `document` as a new version of their copy and returns it. */
export async function saveInCopy(t: TestApp, student: Person, labId: string, document: unknown): Promise<{ programId: string; version: number }> {
  const opened = await call(t, 'post', `/api/labs/${labId}/open`, student.cookie).send({});
  expect([200, 201]).toContain(opened.status);
  const programId = opened.body.program.id as string;
  const saved = await call(t, 'post', `/api/programs/${programId}/versions`, student.cookie).send({ baseVersion: opened.body.program.headVersion, document });
  expect(saved.status, saved.text).toBe(201);
  return { programId, version: saved.body.version?.number ?? saved.body.number };
}

export async function submitVersion(t: TestApp, student: Person, labId: string, ref: { programId: string; version: number }) {
  return call(t, 'post', `/api/labs/${labId}/submissions`, student.cookie).send(ref);
}
