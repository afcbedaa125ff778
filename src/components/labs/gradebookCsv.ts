/**
 * The gradebook as CSV in the browser (papaparse), for when the server's CSV route is not at hand:
 * one row per student, one column per lab (final score, empty when nothing was submitted), then
 * the total and the possible points.
 */
import Papa from 'papaparse';
import type { Gradebook } from '@shared/api/labs';
import { SAFE_CSV_OPTIONS } from '@shared/api/csv';

/** Header and rows as plain values, in the gradebook's order. */
export function gradebookTable(book: Gradebook): (string | number)[][] {
  const header = ['Student', 'E-mail', ...book.labs.map((l) => `${l.title} (/${l.totalPoints})`), 'Total', 'Possible'];
  const rows = book.rows.map((r) => [r.student.name, r.student.email, ...r.cells.map((c) => (c.finalScore === null ? '' : c.finalScore)), r.total, r.possible]);
  return [header, ...rows];
}

/**
 * CSV text with `\r\n` line ends (RFC 4180) and fields quoted where needed; a name or title a
 * spreadsheet would take for a formula is written as text (`SAFE_CSV_OPTIONS`).
 */
export function gradebookToCsv(book: Gradebook): string {
  return Papa.unparse(gradebookTable(book), SAFE_CSV_OPTIONS);
}
