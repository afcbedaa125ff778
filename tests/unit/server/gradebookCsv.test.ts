/**
 * Formula injection in the gradebook download: names come from sign-up and titles from
 * instructors, and a cell starting with =, +, -, @, tab or CR is evaluated by spreadsheets. OWASP's
 * CSV-injection guidance [memory]: such a cell starts with a single quote and is quoted.
 */
import { describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import type { Gradebook } from '@shared/api/labs';
import { gradebookCsv } from '../../../server/services/gradebook';
import { gradebookToCsv } from '@/components/labs/gradebookCsv';

const student = (name: string, email = 'student@larch-hollow.example') => ({
  student: { id: name, name, email },
  cells: [{ labId: 'l1', submissionId: null, finalScore: 7, status: 'graded' as const, late: false }],
  total: 7,
  possible: 10,
});

const book: Gradebook = {
  class: { id: 'c1', name: 'Motor Control 1 (demo)', term: 'Demo term' },
  labs: [{ id: 'l1', title: '=Lab 1', totalPoints: 10, dueAt: null, published: true }],
  rows: [
    student('=HYPERLINK("http://evil.example","x")'),
    student('+1+1'),
    student('-2+3'),
    student('@SUM(A1)'),
    student('\tTabbed'),
    student('\rCarriage'),
    student('Reyes, Ana', '=cmd@larch-hollow.example'),
    student('Plain Name'),
  ],
};

/** The cells of each row as a spreadsheet would read them (quotes removed). */
function cells(csv: string): string[][] {
  return Papa.parse<string[]>(csv, { skipEmptyLines: true }).data;
}

describe.each([
  ['the server download', gradebookCsv],
  ['the browser download', gradebookToCsv],
])('%s', (_name, toCsv) => {
  const rows = cells(toCsv(book));

  it('writes every name starting with =, +, -, @, tab or CR as text behind a single quote', () => {
    expect(rows.slice(1, 7).map((r) => r[0])).toEqual([
      '\'=HYPERLINK("http://evil.example","x")',
      "'+1+1",
      "'-2+3",
      "'@SUM(A1)",
      "'\tTabbed",
      "'\rCarriage",
    ]);
  });

  it('guards e-mail addresses and lab titles in the header too, and quotes each guarded cell', () => {
    expect(rows[7]![1]).toBe("'=cmd@larch-hollow.example");
    expect(rows[0]![2]).toMatch(/^'=Lab 1 \(\/?10\)$/);
    expect(toCsv(book)).toContain('"\'+1+1"');
  });

  it('leaves ordinary names and the scores as they are', () => {
    expect(rows[8]![0]).toBe('Plain Name');
    expect(rows[7]![0]).toBe('Reyes, Ana');
    expect(rows[8]!.slice(2)).toEqual(['7', '7', '10']);
  });
});
