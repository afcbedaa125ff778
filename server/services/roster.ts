/**
 * Roster upload: a CSV with the header `email,name`, parsed with papaparse, each row checked on its
 * own. Existing student accounts are enrolled; new addresses get an invitation e-mail; nothing
 * about one bad row stops the others. Lines are numbered as in a spreadsheet (header = line 1).
 */
import Papa from 'papaparse';
import { EmailSchema, PersonNameSchema, type RosterReport } from '@shared/api';
import type { AppContext } from '../context';
import type { User } from '../db/users';
import { findUserByEmail } from '../db/users';
import { enrol, isEnrolled } from '../db/classes';
import { hasOpenClassInvitation } from '../db/oneTimeTokens';
import { failure, success, type Outcome } from '../http/failure';
import { authorisedClass } from './classes';
import { sendInvitation } from './accounts';

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

  const report: RosterReport = { added: [], invited: [], already: [], rejected: [] };
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

    const user = await findUserByEmail(ctx.orm, rawEmail);
    if (user) {
      if (user.role !== 'student') report.rejected.push({ ...entry, reason: `this address belongs to an ${user.role} account` });
      else if (await isEnrolled(ctx.orm, cls.id, user.id)) report.already.push(entry);
      else {
        await enrol(ctx.orm, cls.id, user.id, ctx.clock.now());
        report.added.push(entry);
      }
    } else if (await hasOpenClassInvitation(ctx.orm, cls.id, rawEmail, ctx.clock.now())) {
      report.already.push({ ...entry, reason: 'already invited' });
    } else {
      await sendInvitation(ctx, { email: rawEmail, name: rawName, role: 'student', classId: cls.id, className: cls.name });
      report.invited.push(entry);
    }
  }
  return success(report);
}
