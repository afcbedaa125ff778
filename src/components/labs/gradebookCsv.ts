/**
 * The gradebook as CSV in the browser (papaparse), for when the server's CSV route is not at hand:
 * the same table as the server's download (`gradebookTable` in `shared/api/gradebookTable.ts`).
 */
import Papa from 'papaparse';
import type { Gradebook } from '@shared/api/labs';
import { SAFE_CSV_OPTIONS } from '@shared/api/csv';
import { gradebookTable } from '@shared/api/gradebookTable';

export { gradebookTable };

/**
 * CSV text with `\r\n` line ends (RFC 4180) and fields quoted where needed; a name or title a
 * spreadsheet would take for a formula is written as text (`SAFE_CSV_OPTIONS`).
 */
export function gradebookToCsv(book: Gradebook): string {
  return Papa.unparse(gradebookTable(book), SAFE_CSV_OPTIONS);
}
