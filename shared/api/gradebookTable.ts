/**
 * The gradebook as a table for a learning management system's grade import: one row per student
 * keyed by e-mail (the column such imports match accounts on), the name, then for each lab in due
 * order its score, the days it came in late and the late penalty taken, then the total. Server
 * download and the browser's fallback write the same table (`SAFE_CSV_OPTIONS` for the cells).
 */
import type { Gradebook } from './labs';

export const GRADEBOOK_KEY_COLUMNS = ['Email', 'Student'] as const;

/** Header and rows as plain values; an empty cell where a student has no submission. */
export function gradebookTable(book: Gradebook): (string | number)[][] {
  const header = [
    ...GRADEBOOK_KEY_COLUMNS,
    ...book.labs.flatMap((l) => [`${l.title} (/${l.totalPoints})`, `${l.title}: late days`, `${l.title}: late penalty %`]),
    'Total',
    'Possible',
  ];
  const rows = book.rows.map((r) => [
    r.student.email,
    r.student.name,
    ...r.cells.flatMap((c) => (c.submissionId === null ? ['', '', ''] : [c.finalScore ?? '', c.lateDays, c.penaltyPercent])),
    r.total,
    r.possible,
  ]);
  return [header, ...rows];
}
