/**
 * Lab authoring: create, update, publish, unpublish, delete, "Try it" and the standard labs as
 * templates. Access is decided by `labPolicy` (and `classPolicy` for a class's list) before
 * anything is read or written. Publishing e-mails the class's students.
 */
import type { CreateLabRequest, LabDetail, LabPanel, LabStarterChoice, ProgramSummary, ProgramVersionRef, UpdateLabRequest } from '@shared/api';
import type { GradeReport } from '@shared/checks';
import { DEFAULT_PANEL_ID } from '@shared/field/panels';
import { STANDARD_LABS, standardLab } from '@shared/labs';
import { publicUrl } from '../config';
import type { AppContext } from '../context';
import type { User } from '../db/users';
import { listStudents, type ClassRecord } from '../db/classes';
import * as db from '../db/labs';
import { findProgram, findVersion, insertProgram } from '../db/programs';
import { failure, success, type Outcome } from '../http/failure';
import { labPublishedMail } from '../mail/templates';
import { refusal } from '../policies/access';
import { labAccess, managesClass, type LabAction } from '../policies/labPolicy';
import { programAccess } from '../policies/programPolicy';
import { authorisedClass } from './classes';
import { checkLabScript, countChecks, labRun, resolvePanel } from './labChecks';
import { labView } from './labViews';
import { gradeOnLab } from './grading';
import { programView } from './views';

export const DEFAULT_PANEL: LabPanel = { kind: 'builtIn', id: DEFAULT_PANEL_ID };

/** A lab with its class, if the actor may act on it. */
export async function authorisedLab(ctx: AppContext, actor: User, labId: string, action: LabAction): Promise<Outcome<{ lab: db.LabRecord; cls: ClassRecord }>> {
  const found = await db.findLabInContext(ctx.orm, labId, actor.id);
  if (!found) return failure('not_found', 'This lab does not exist or is not open to you');
  const { lab, cls } = found;
  return refusal(labAccess(actor, lab, cls, found.enrolled, action), 'lab') ?? success({ lab, cls });
}

/** The API view of a lab for `actor` (script only for staff). */
export async function viewLab(ctx: AppContext, lab: db.LabRecord, staff: boolean): Promise<LabDetail> {
  const run = labRun(lab.panel as LabPanel, lab.checkScript);
  const counts = run.ok ? countChecks(run.value.script) : { visible: 0, hidden: 0, maxScore: 0 };
  return labView(lab, counts, await db.listAttachments(ctx.orm, lab.id), staff);
}

/** The starter's stored columns; a program starter must be a version the actor may read. */
async function resolveStarter(ctx: AppContext, actor: User, starter: LabStarterChoice): Promise<Outcome<Pick<db.NewLab, 'starterKind' | 'starterProgramId' | 'starterVersion' | 'starterDocument'>>> {
  if (starter.kind === 'empty') return success({ starterKind: 'empty', starterProgramId: null, starterVersion: null, starterDocument: null });
  const notFound = failure('validation', `starter: no program version ${starter.version} of yours with that id`, { fields: { 'starter.programId': 'not one of your programs, or no such version' } });
  const program = await findProgram(ctx.orm, starter.programId);
  if (!program || (await programAccess(ctx.orm, actor, program, 'read')) !== 'allowed') return notFound;
  const version = await findVersion(ctx.orm, program.id, starter.version);
  if (!version) return notFound;
  return success({ starterKind: 'program', starterProgramId: program.id, starterVersion: version.number, starterDocument: version.document });
}

/** Panel and script checked together (the script must fit the panel). */
function checkPanelAndScript(panel: LabPanel, script: unknown): Outcome<null> {
  const layout = resolvePanel(panel);
  if (!layout.ok) return layout;
  const checked = checkLabScript(script, layout.value);
  return checked.ok ? success(null) : checked;
}

export async function createLab(ctx: AppContext, actor: User, classId: string, req: CreateLabRequest): Promise<Outcome<LabDetail>> {
  const cls = await authorisedClass(ctx, actor, classId, 'manage');
  if (!cls.ok) return cls;
  const panel = req.panel ?? DEFAULT_PANEL;
  const checked = checkPanelAndScript(panel, req.script);
  if (!checked.ok) return checked;
  const starter = await resolveStarter(ctx, actor, req.starter ?? { kind: 'empty' });
  if (!starter.ok) return starter;
  const now = ctx.clock.now();
  const lab = await db.insertLab(ctx.orm, {
    classId,
    authorId: actor.id,
    title: req.title,
    summary: req.summary ?? '',
    brief: req.brief ?? '',
    panel,
    ...starter.value,
    checkScript: req.script,
    totalPoints: req.totalPoints ?? 100,
    dueAt: req.dueAt ? new Date(req.dueAt) : null,
    latePolicy: req.latePolicy ?? { kind: 'accept' },
    createdAt: now,
    updatedAt: now,
  });
  return success(await viewLab(ctx, lab, true));
}

export async function updateLab(ctx: AppContext, actor: User, labId: string, req: UpdateLabRequest): Promise<Outcome<LabDetail>> {
  const found = await authorisedLab(ctx, actor, labId, 'manage');
  if (!found.ok) return found;
  const { lab } = found.value;
  const changes: db.LabChanges = { updatedAt: ctx.clock.now() };
  if (req.panel !== undefined || req.script !== undefined) {
    const checked = checkPanelAndScript(req.panel ?? (lab.panel as LabPanel), req.script ?? lab.checkScript);
    if (!checked.ok) return checked;
    if (req.panel !== undefined) changes.panel = req.panel;
    if (req.script !== undefined) changes.checkScript = req.script;
  }
  if (req.starter !== undefined) {
    const starter = await resolveStarter(ctx, actor, req.starter);
    if (!starter.ok) return starter;
    Object.assign(changes, starter.value);
  }
  if (req.title !== undefined) changes.title = req.title;
  if (req.summary !== undefined) changes.summary = req.summary;
  if (req.brief !== undefined) changes.brief = req.brief;
  if (req.totalPoints !== undefined) changes.totalPoints = req.totalPoints;
  if (req.dueAt !== undefined) changes.dueAt = req.dueAt ? new Date(req.dueAt) : null;
  if (req.latePolicy !== undefined) changes.latePolicy = req.latePolicy;
  const updated = await db.updateLab(ctx.orm, labId, changes);
  return updated ? success(await viewLab(ctx, updated, true)) : failure('not_found', 'This lab does not exist or is not open to you');
}

export async function getLab(ctx: AppContext, actor: User, labId: string): Promise<Outcome<LabDetail>> {
  const found = await authorisedLab(ctx, actor, labId, 'view');
  if (!found.ok) return found;
  const staff = managesClass(actor, found.value.cls);
  return success(await viewLab(ctx, found.value.lab, staff));
}

export async function deleteLab(ctx: AppContext, actor: User, labId: string): Promise<Outcome<null>> {
  const found = await authorisedLab(ctx, actor, labId, 'manage');
  if (!found.ok) return found;
  await db.deleteLab(ctx.orm, labId);
  return success(null);
}

/** Publishes (e-mailing the students the first time) or unpublishes a lab. */
export async function setPublished(ctx: AppContext, actor: User, labId: string, published: boolean): Promise<Outcome<LabDetail>> {
  const found = await authorisedLab(ctx, actor, labId, 'manage');
  if (!found.ok) return found;
  const { lab, cls } = found.value;
  const wasPublished = lab.publishedAt !== null;
  const updated = await db.updateLab(ctx.orm, labId, { publishedAt: published ? (lab.publishedAt ?? ctx.clock.now()) : null, updatedAt: ctx.clock.now() });
  if (!updated) return failure('not_found', 'This lab does not exist or is not open to you');
  if (published && !wasPublished) await announce(ctx, updated, cls);
  return success(await viewLab(ctx, updated, true));
}

/** Mails every student of the class; a failed message is logged, never fails the publish. */
async function announce(ctx: AppContext, lab: db.LabRecord, cls: ClassRecord): Promise<void> {
  const students = await listStudents(ctx.orm, cls.id);
  const baseUrl = publicUrl(ctx.config);
  const results = await Promise.allSettled(
    students.map((s) => ctx.mailer.send(labPublishedMail({ to: s.email, baseUrl, className: cls.name, labTitle: lab.title, labId: lab.id, dueAt: lab.dueAt }))),
  );
  const failed = results.filter((r) => r.status === 'rejected').length;
  if (failed > 0) ctx.logger.warn({ labId: lab.id, failed }, 'some lab announcements could not be sent');
}

/** "Try it": the full report (hidden checks included) of one of the actor's program versions. */
export async function tryLab(ctx: AppContext, actor: User, labId: string, ref: ProgramVersionRef): Promise<Outcome<{ report: GradeReport | null; note: string | null }>> {
  const found = await authorisedLab(ctx, actor, labId, 'manage');
  if (!found.ok) return found;
  const program = await findProgram(ctx.orm, ref.programId);
  const notFound = failure('not_found', 'No program version with that id and number that you may read');
  if (!program || (await programAccess(ctx.orm, actor, program, 'read')) !== 'allowed') return notFound;
  const version = await findVersion(ctx.orm, program.id, ref.version);
  if (!version) return notFound;
  const graded = await gradeOnLab(ctx, found.value.lab, version.document);
  return graded.ok ? success({ report: graded.value.report, note: graded.value.note }) : graded;
}

export function listTemplates() {
  return STANDARD_LABS.map((lab) => ({ id: lab.id, order: lab.order, title: lab.title, summary: lab.summary, panel: lab.panel }));
}

export interface FromTemplateOptions {
  dueAt?: string | null;
  totalPoints?: number;
  latePolicy?: CreateLabRequest['latePolicy'];
  demo?: boolean;
  publish?: boolean;
}

/** Copies a standard lab into a class (unpublished); its reference solution becomes the actor's program. */
export async function labFromTemplate(ctx: AppContext, actor: User, classId: string, templateId: string, options: FromTemplateOptions = {}): Promise<Outcome<{ lab: LabDetail; solution: ProgramSummary }>> {
  const cls = await authorisedClass(ctx, actor, classId, 'manage');
  if (!cls.ok) return cls;
  const template = standardLab(templateId);
  if (!template) {
    const known = STANDARD_LABS.map((l) => l.id).join(', ');
    return failure('validation', `templateId: no standard lab "${templateId}" (there are ${known})`, { fields: { templateId: `no standard lab "${templateId}"` } });
  }
  const now = ctx.clock.now();
  // The lab's points default to the script's, so the score reads like the report's.
  const run = labRun({ kind: 'builtIn', id: template.panel }, template.script);
  const maxScore = run.ok ? countChecks(run.value.script).maxScore : 100;
  const lab = await db.insertLab(ctx.orm, {
    classId,
    authorId: actor.id,
    title: template.title,
    summary: template.summary,
    brief: template.brief,
    panel: { kind: 'builtIn', id: template.panel },
    starterKind: 'template',
    starterDocument: template.starter,
    checkScript: template.script,
    totalPoints: options.totalPoints ?? Math.max(1, maxScore),
    dueAt: options.dueAt ? new Date(options.dueAt) : null,
    latePolicy: options.latePolicy ?? { kind: 'accept' },
    templateId: template.id,
    demo: options.demo ?? false,
    publishedAt: options.publish ? now : null,
    createdAt: now,
    updatedAt: now,
  });
  const solution = await insertProgram(ctx.orm, {
    ownerId: actor.id,
    authorId: actor.id,
    title: `Reference: ${template.title}`,
    labId: lab.id,
    demo: options.demo ?? false,
    document: template.solution,
    message: `Reference solution of the standard lab "${template.title}"`,
    now,
  });
  return success({ lab: await viewLab(ctx, lab, true), solution: programView(solution.program) });
}
