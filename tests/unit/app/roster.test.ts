import { describe, expect, it } from 'vitest';
import type { RosterReport } from '@shared/api/classes';
import { pendingInvitations, rosterGroups, type ClassInvitation } from '@/components/app/roster';

const NOW = new Date('2026-03-10T12:00:00.000Z');
const invitation = (email: string, expiresAt: string, usedAt: string | null = null): ClassInvitation => ({ email, name: null, expiresAt, usedAt });

describe('pending invitations', () => {
  it('keeps only unused invitations that have not expired, soonest to expire first', () => {
    const all = [
      invitation('late@larch-hollow.example', '2026-03-16T09:00:00.000Z'),
      invitation('used@larch-hollow.example', '2026-03-15T09:00:00.000Z', '2026-03-09T08:00:00.000Z'),
      invitation('expired@larch-hollow.example', '2026-03-10T11:59:59.000Z'),
      invitation('soon@larch-hollow.example', '2026-03-11T09:00:00.000Z'),
    ];
    expect(pendingInvitations(all, NOW).map((i) => i.email)).toEqual(['soon@larch-hollow.example', 'late@larch-hollow.example']);
  });

  it('treats an invitation expiring exactly now as expired', () => {
    expect(pendingInvitations([invitation('edge@larch-hollow.example', NOW.toISOString())], NOW)).toEqual([]);
  });
});

describe('the roster report groups', () => {
  it('lists all three groups in a fixed order, empty ones too, rows by line number', () => {
    const report: RosterReport = {
      invited: [
        { line: 4, email: 'b@larch-hollow.example', name: 'B' },
        { line: 2, email: 'a@larch-hollow.example', name: 'A' },
      ],
      already: [],
      rejected: [{ line: 3, email: 'not-an-address', name: 'C', reason: 'email: not a valid e-mail address' }],
    };
    const groups = rosterGroups(report);
    expect(groups.map((g) => [g.key, g.title, g.rows.length])).toEqual([
      ['invited', 'Invited', 2],
      ['already', 'Already in', 0],
      ['rejected', 'Rejected', 1],
    ]);
    expect(groups[0]!.rows.map((r) => r.line)).toEqual([2, 4]);
    expect(groups[2]!.rows[0]).toMatchObject({ line: 3, reason: 'email: not a valid e-mail address' });
    expect(report.invited[0]!.line).toBe(4);
  });
});
