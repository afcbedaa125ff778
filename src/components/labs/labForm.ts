/**
 * The lab authoring form as plain data: made from a lab as the server sends it, turned back into
 * the PATCH body. Dates travel as ISO strings; the form holds the due date as ms since the epoch
 * (what the date picker takes) or null.
 */
import type { LabDetail, LabPanel, LatePolicy, UpdateLabRequest } from '@shared/api/labs';
import type { DraftScript } from './scriptModel';

export interface LabForm {
  title: string;
  summary: string;
  brief: string;
  panel: LabPanel;
  /** A new starter: `''` for an empty program or the id of one of the author's programs (its head
   * version is used); null keeps the starter the lab has. */
  starterChoice: string | null;
  script: DraftScript;
  totalPoints: number;
  dueAtMs: number | null;
  latePolicy: LatePolicy;
}

const FALLBACK_SCRIPT: DraftScript = { panel: 'reversing-conveyor', steps: [{ wait: 100 }] };

/** The form for a lab (an instructor's view: the script is there). */
export function formFromLab(lab: LabDetail): LabForm {
  const script = typeof lab.script === 'object' && lab.script !== null && Array.isArray((lab.script as { steps?: unknown }).steps) ? (lab.script as DraftScript) : FALLBACK_SCRIPT;
  return {
    title: lab.title,
    summary: lab.summary,
    brief: lab.brief,
    panel: lab.panel,
    starterChoice: null,
    script,
    totalPoints: lab.totalPoints,
    dueAtMs: lab.dueAt === null ? null : Date.parse(lab.dueAt),
    latePolicy: lab.latePolicy,
  };
}

/** The PATCH body; the starter only when the author picked another (a template lab keeps its own). */
export function updateFromForm(form: LabForm, starterVersion: (programId: string) => number | undefined): UpdateLabRequest {
  const body: UpdateLabRequest = {
    title: form.title,
    summary: form.summary,
    brief: form.brief,
    panel: form.panel,
    script: form.script,
    totalPoints: form.totalPoints,
    dueAt: form.dueAtMs === null ? null : new Date(form.dueAtMs).toISOString(),
    latePolicy: form.latePolicy.kind === 'penalty' ? { kind: 'penalty', penaltyPercent: form.latePolicy.penaltyPercent ?? 10 } : { kind: form.latePolicy.kind },
  };
  if (form.starterChoice === '') body.starter = { kind: 'empty' };
  else if (form.starterChoice !== null) {
    const version = starterVersion(form.starterChoice);
    if (version !== undefined) body.starter = { kind: 'program', programId: form.starterChoice, version };
  }
  return body;
}
