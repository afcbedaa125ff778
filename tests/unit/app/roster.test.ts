import { describe, expect, it } from 'vitest';
import type { RosterReport } from '@shared/api/classes';
import { rosterGroups, unacceptedInvitations, type ClassInvitation } from '@/components/app/roster';

const NOW = new Date('2026-03-10T12:00:00.000Z');
const invitation = (email: string, expiresAt: string, usedAt: string | null = null): ClassInvitation => ({ id: `id-${email}`, email, name: null, expiresAt, usedAt });

describe('invitations not accepted', () => {
  it('drops accepted ones; lists open ones soonest to expire first, then expired ones most recent first', () => {
    const all = [
      invitation('late@larch-hollow.example', '2026-03-16T09:00:00.000Z'),
      invitation('used@larch-hollow.example', '2026-03-15T09:00:00.000Z', '2026-03-09T08:00:00.000Z'),
      invitation('expired@larch-hollow.example', '2026-03-10T11:59:59.000Z'),
      invitation('long-expired@larch-hollow.example', '2026-03-01T09:00:00.000Z'),
      invitation('soon@larch-hollow.example', '2026-03-11T09:00:00.000Z'),
    ];
    expect(unacceptedInvitations(all, NOW).map((i) => [i.email, i.expired])).toEqual([
      ['soon@larch-hollow.example', false],
      ['late@larch-hollow.example', false],
      ['expired@larch-hollow.example', true],
      ['long-expired@larch-hollow.example', true],
    ]);
  });

  it('counts only the newest invitation of an address (given newest first): one sent again or accepted since is not listed', () => {
    const all = [
      invitation('again@larch-hollow.example', '2026-03-17T09:00:00.000Z'),
      invitation('joined@larch-hollow.example', '2026-03-16T09:00:00.000Z', '2026-03-10T08:00:00.000Z'),
      invitation('Again@larch-hollow.example', '2026-03-10T09:00:00.000Z'),
      invitation('joined@larch-hollow.example', '2026-03-09T09:00:00.000Z'),
    ];
    expect(unacceptedInvitations(all, NOW).map((i) => [i.email, i.expired])).toEqual([['again@larch-hollow.example', false]]);
  });

  it('treats an invitation expiring exactly now as expired', () => {
    expect(unacceptedInvitations([invitation('edge@larch-hollow.example', NOW.toISOString())], NOW).map((i) => i.expired)).toEqual([true]);
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
