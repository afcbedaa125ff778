/**
 * Adding students to a class: a roster upload (a CSV with the header `email,name`, parsed with
 * papaparse, each row checked on its own; nothing about one bad row stops the others; lines are
 * numbered as in a spreadsheet, header = line 1) or one student by hand. Every address gets an
 * invitation, whether or not it has an account, and nobody is enrolled until they accept it: the
 * report says nothing about anyone's account, only whether the address is in the class already.
 */
import Papa from 'papaparse';
import { EmailSchema, PersonNameSchema, type ClassInvitationSent, type InviteStudentRequest, type RosterReport } from '@shared/api';
import type { AppContext } from '../context';
import type { User } from '../db/users';
import { findUserByEmail } from '../db/users';
import { isEnrolled, type ClassRecord } from '../db/classes';
import { hasOpenClassInvitation } from '../db/oneTimeTokens';
import { failure, success, type Outcome } from '../http/failure';
import { authorisedClass } from './classes';
import { sendInvitation } from './invitations';

/** A classroom list, not a directory import: 500 rows is several sections. */
export const ROSTER_MAX_ROWS = 500;

export async function importRoster(ctx: AppContext, actor: User, classId: string, csv: string): Promise<Outcome<RosterReport>> {
  const found = await authorisedClass(ctx, actor, classId, 'manage');
  if (!found.ok) return found;
  const cls = found.value;

  const parsed = Papa.parse<Record<string, string>>(csv.replace(/^\uFEFF/, ''), {
    header: true,
    skipEmptyLines: 'greedy',
    transformHeader: (h) => h.trim().toLowerCase(),
  });
  const headers = parsed.meta.fields ?? [];
  if (!headers.includes('email') || !headers.includes('name')) {
    return failure('validation', `The roster needs a header line "email,name"; found "${headers.join(',')}"`, { fields: { file: 'the first line must be the header email,name' } });
  }
  if (parsed.data.length > ROSTER_MAX_ROWS) {
    return failure('validation', `The roster has ${parsed.data.length} rows; at most ${ROSTER_MAX_ROWS} are accepted at once`, { fields: { file: 'too many rows' } });
  }

  const report: RosterReport = { invited: [], already: [], rejected: [] };
  const seen = new Set<string>();
  const rowErrors = new Map<number, string>();
  for (const e of parsed.errors) if (e.row !== undefined) rowErrors.set(e.row, e.message);

  for (const [index, row] of parsed.data.entries()) {
    const line = index + 2;
    const rawEmail = (row.email ?? '').trim();
    const rawName = (row.name ?? '').trim();
    const entry = { line, email: rawEmail, name: rawName };
    const email = EmailSchema.safeParse(rawEmail);
    const name = PersonNameSchema.safeParse(rawName);
    const problem = rowErrors.get(index) ?? (!email.success ? `email: ${email.error.issues[0].message}` : !name.success ? `name: ${name.error.issues[0].message}` : null);
    if (problem) {
      report.rejected.push({ ...entry, reason: problem });
      continue;
    }
    const key = rawEmail.toLowerCase();
    if (seen.has(key)) {
      report.rejected.push({ ...entry, reason: 'this e-mail appears on an earlier line' });
      continue;
    }
    seen.add(key);

    if (await isInClass(ctx, cls, rawEmail)) report.already.push({ ...entry, reason: 'already in the class' });
    else if (await hasOpenClassInvitation(ctx.orm, cls.id, rawEmail, ctx.clock.now())) report.already.push({ ...entry, reason: 'already invited' });
    else {
      await sendInvitation(ctx, { email: rawEmail, name: rawName, role: 'student', classId: cls.id, className: cls.name });
      report.invited.push(entry);
    }
  }
  return success(report);
}

/** True when the address belongs to someone enrolled in the class (what the roster shows anyway). */
async function isInClass(ctx: AppContext, cls: ClassRecord, email: string): Promise<boolean> {
  const user = await findUserByEmail(ctx.orm, email);
  return user !== null && (await isEnrolled(ctx.orm, cls.id, user.id));
}

/**
 * Invites one student by hand. An open invitation to the same address is replaced by this one (the
 * older link stops working), so this is also how an invitation is sent again.
 */
export async function inviteStudent(ctx: AppContext, actor: User, classId: string, req: InviteStudentRequest): Promise<Outcome<ClassInvitationSent>> {
  const found = await authorisedClass(ctx, actor, classId, 'manage');
  if (!found.ok) return found;
  const cls = found.value;
  if (await isInClass(ctx, cls, req.email)) {
    return failure('conflict', `${req.email} is in the class already`, { fields: { email: 'is in the class already' } });
  }
  const sent = await sendInvitation(ctx, { email: req.email, name: req.name, role: 'student', classId: cls.id, className: cls.name });
  return success({ email: sent.email, name: req.name, expiresAt: sent.expiresAt });
}
