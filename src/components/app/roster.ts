/** Pure helpers of the class roster page: which invitations are still open, and the upload report's groups. */
import type { z } from 'zod';
import type { PendingInvitationSchema, RosterReport } from '@shared/api/classes';

export type ClassInvitation = z.infer<typeof PendingInvitationSchema>;

/** An invitation nobody accepted yet, and whether its link still works at the time asked. */
export interface UnacceptedInvitation extends ClassInvitation {
  expired: boolean;
}

/**
 * The invitations not accepted, one per address: `all` comes newest first, as the server lists
 * them (accepted ones too, not cancelled ones), and only an address's newest invitation counts —
 * sending one again expires the one before, which is not something left to do. The open ones come
 * first, soonest to expire first, then the expired ones, most recent first, so an instructor sees
 * who still has to be sent a new link.
 */
export function unacceptedInvitations(all: readonly ClassInvitation[], now: Date): UnacceptedInvitation[] {
  const newestPerAddress = new Map<string, ClassInvitation>();
  for (const i of all) if (!newestPerAddress.has(i.email.toLowerCase())) newestPerAddress.set(i.email.toLowerCase(), i);
  const unaccepted = [...newestPerAddress.values()].filter((i) => i.usedAt === null).map((i) => ({ ...i, expired: Date.parse(i.expiresAt) <= now.getTime() }));
  const open = unaccepted.filter((i) => !i.expired).sort((a, b) => a.expiresAt.localeCompare(b.expiresAt));
  const expired = unaccepted.filter((i) => i.expired).sort((a, b) => b.expiresAt.localeCompare(a.expiresAt));
  return [...open, ...expired];
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
