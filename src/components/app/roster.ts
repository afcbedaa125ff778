/** Pure helpers of the class roster page: which invitations are still open, and the upload report's groups. */
import type { z } from 'zod';
import type { PendingInvitationSchema, RosterReport } from '@shared/api/classes';

export type ClassInvitation = z.infer<typeof PendingInvitationSchema>;

/** The invitations that can still be accepted at `now` (the server lists used and expired ones too), soonest to expire first. */
export function pendingInvitations(all: readonly ClassInvitation[], now: Date): ClassInvitation[] {
  return all.filter((i) => i.usedAt === null && Date.parse(i.expiresAt) > now.getTime()).sort((a, b) => a.expiresAt.localeCompare(b.expiresAt));
}

export type RosterGroupKey = keyof RosterReport;

/** How each group of the upload report is headed and what it means, in the order shown. */
export const ROSTER_GROUPS = {
  invited: { title: 'Invited', hint: 'an invitation e-mail is on its way; they join when they accept it' },
  already: { title: 'Already in', hint: 'in the class or invited before; nothing changed' },
  rejected: { title: 'Rejected', hint: 'fix these lines and upload them again' },
} as const satisfies Record<RosterGroupKey, { title: string; hint: string }>;

export interface RosterGroup {
  key: RosterGroupKey;
  title: string;
  hint: string;
  rows: RosterReport[RosterGroupKey];
}

/** The report as its groups, rows in file order, every group present (an empty one says 0). */
export function rosterGroups(report: RosterReport): RosterGroup[] {
  return (Object.keys(ROSTER_GROUPS) as RosterGroupKey[]).map((key) => ({
    key,
    ...ROSTER_GROUPS[key],
    rows: [...report[key]].sort((a, b) => a.line - b.line),
  }));
}
