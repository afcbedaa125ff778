import { describe, expect, it } from 'vitest';
import type { LabStudentRow } from '@shared/api/teaching';
import { filterFrom, matchesFilter, neighbours, reviewOrder, studentListLink } from '@/components/teaching/studentFilters';
import { mailPieces } from '@/components/admin/mailText';

const row = (name: string, over: Partial<LabStudentRow> = {}): LabStudentRow => ({
  student: { id: name, name, email: `${name.toLowerCase()}@larch-hollow.example` },
  standing: 'submitted',
  submissionId: `s-${name}`,
  status: 'graded',
  submissions: 1,
  submittedAt: '2026-10-01T10:00:00Z',
  late: false,
  lateDays: 0,
  penaltyPercent: 0,
  finalScore: 5,
  totalPoints: 10,
  ...over,
});

describe('the lab student list', () => {
  const rows = [row('Tom'), row('Ana', { late: true, lateDays: 1 }), row('Kai', { standing: 'not_started', submissionId: null, status: null }), row('Priya', { standing: 'returned', status: 'returned' })];

  it('filters by standing and by lateness, and reads the filter from the address', () => {
    expect(rows.filter((r) => matchesFilter(r, 'not_started')).map((r) => r.student.name)).toEqual(['Kai']);
    expect(rows.filter((r) => matchesFilter(r, 'late')).map((r) => r.student.name)).toEqual(['Ana']);
    expect(rows.filter((r) => matchesFilter(r, 'all'))).toHaveLength(4);
    expect(filterFrom('returned')).toBe('returned');
    expect(filterFrom('everything')).toBe('all');
    expect(filterFrom(['late'])).toBe('all');
    expect(studentListLink('l1', 'not_started')).toBe('/labs/l1/submissions?show=not_started');
    expect(studentListLink('l1', 'all')).toBe('/labs/l1/submissions');
  });

  it('walks the submissions by student name, skipping students without one, with no neighbour past either end', () => {
    const order = reviewOrder(rows);
    expect(order).toEqual(['s-Ana', 's-Priya', 's-Tom']);
    expect(neighbours(order, 's-Ana')).toEqual({ previous: null, next: 's-Priya', index: 0 });
    expect(neighbours(order, 's-Priya')).toEqual({ previous: 's-Ana', next: 's-Tom', index: 1 });
    expect(neighbours(order, 's-Tom')).toEqual({ previous: 's-Priya', next: null, index: 2 });
    expect(neighbours(order, 'elsewhere')).toEqual({ previous: null, next: null, index: -1 });
  });
});

describe('a mail as pieces', () => {
  it('turns this site’s links into in-app paths, keeps others outside, and leaves a closing full stop out of a link', () => {
    const pieces = mailPieces('Open http://localhost:3000/accept-invitation#token=abc or see https://example.org/help.', 'http://localhost:3000');
    expect(pieces).toEqual([
      { kind: 'text', text: 'Open ' },
      { kind: 'link', href: 'http://localhost:3000/accept-invitation#token=abc', inApp: '/accept-invitation#token=abc' },
      { kind: 'text', text: ' or see ' },
      { kind: 'link', href: 'https://example.org/help', inApp: null },
      { kind: 'text', text: '.' },
    ]);
    expect(mailPieces('<b>no markup</b> javascript:alert(1)', 'http://x')).toEqual([{ kind: 'text', text: '<b>no markup</b> javascript:alert(1)' }]);
  });
});
