/**
 * Writing user-supplied text into CSV files that people open in a spreadsheet. A cell that starts
 * with `=`, `+`, `-` or `@` (or a tab or carriage return) is read as a formula by common
 * spreadsheet programs, so a student who signs up as `=HYPERLINK(…)` would put a live formula in
 * the instructor's gradebook. OWASP's CSV-injection guidance [memory]: prefix such a cell with a
 * single quote (shown as text, not evaluated) and quote the cell.
 */

/** A cell that a spreadsheet would evaluate: papaparse's `escapeFormulae` takes this pattern. */
export const CSV_FORMULA_START = /^[=+\-@\t\r]/;

/** Options for `Papa.unparse` that every CSV download of ours uses. */
export const SAFE_CSV_OPTIONS = { newline: '\r\n', escapeFormulae: CSV_FORMULA_START } as const;
