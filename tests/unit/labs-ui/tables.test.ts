import { describe, expect, it } from 'vitest';
import Papa from 'papaparse';
import type { Gradebook, LabDetail, SubmissionRow } from '@shared/api/labs';
import { THREE_WIRE } from '@shared/labs';
import { gradebookTable, gradebookToCsv } from '@/components/labs/gradebookCsv';
import { formFromLab, updateFromForm } from '@/components/labs/labForm';
import { filterSubmissions } from '@/components/labs/submissionTable';

const book: Gradebook = {
  class: { id: 'c1', name: 'Motor Control 1 (demo)', term: 'Demo term' },
  labs: [
    { id: 'l1', title: 'Two-wire control', totalPoints: 10, checkPoints: 5, dueAt: null, published: true },
    { id: 'l2', title: 'Three-wire, sealed', totalPoints: 20, checkPoints: 20, dueAt: null, published: true },
  ],
  rows: [
    {
      student: { id: 's1', name: 'Reyes, Ana', email: 'ana@larch-hollow.example' },
      cells: [
        { labId: 'l1', submissionId: 'x', finalScore: 9.5, status: 'returned', late: true, lateDays: 2, penaltyPercent: 10 },
        { labId: 'l2', submissionId: null, finalScore: null, status: null, late: false, lateDays: 0, penaltyPercent: 0 },
      ],
      total: 9.5,
      possible: 30,
    },
  ],
};

describe('the gradebook export', () => {
  it('is keyed by e-mail, with score, late days and penalty per lab in the gradebook’s order, then the total and the possible points', () => {
    expect(gradebookTable(book)).toEqual([
      [
        'Email',
        'Student',
        'Two-wire control (/10)',
        'Two-wire control: late days',
        'Two-wire control: late penalty %',
        'Three-wire, sealed (/20)',
        'Three-wire, sealed: late days',
        'Three-wire, sealed: late penalty %',
        'Total',
        'Possible',
      ],
      ['ana@larch-hollow.example', 'Reyes, Ana', 9.5, 2, 10, '', '', '', 9.5, 30],
    ]);
  });

  it('quotes fields with commas as RFC 4180 section 2 requires, and reads back the same cells', () => {
    const csv = gradebookToCsv(book);
    expect(csv.split('\r\n')[1]).toBe('ana@larch-hollow.example,"Reyes, Ana",9.5,2,10,,,,9.5,30');
    const back = Papa.parse<string[]>(csv, { skipEmptyLines: true }).data;
    expect(back[0]![5]).toBe('Three-wire, sealed (/20)');
    expect(back[1]).toEqual(['ana@larch-hollow.example', 'Reyes, Ana', '9.5', '2', '10', '', '', '', '9.5', '30']);
  });
});

const row = (over: Partial<SubmissionRow>): SubmissionRow => ({
  id: 'r',
  student: { id: 's', name: 'Ana Reyes', email: 'ana.reyes@larch-hollow.example' },
  submittedAt: '2026-10-01T10:00:00Z',
  late: false,
  status: 'graded',
  version: 2,
  attempt: 1,
  latest: true,
  autoScore: 10,
  finalScore: 10,
  totalPoints: 11,
  penaltyPercent: 0,
  gradingNote: null,
  ...over,
});

describe('the submissions table filter', () => {
  const rows = [row({ id: 'a' }), row({ id: 'b', latest: false, attempt: 0 }), row({ id: 'c', student: { id: 't', name: 'Tom Becker', email: 'tom.becker@larch-hollow.example' } })];

  it('finds a student by part of the name or e-mail, in any case', () => {
    expect(filterSubmissions(rows, { student: 'BECK', latestOnly: false }).map((r) => r.id)).toEqual(['c']);
    expect(filterSubmissions(rows, { student: 'ana.re', latestOnly: false }).map((r) => r.id)).toEqual(['a', 'b']);
    expect(filterSubmissions(rows, { student: '  ', latestOnly: false })).toHaveLength(3);
  });

  it('keeps only each student’s newest submission when asked', () => {
    expect(filterSubmissions(rows, { student: '', latestOnly: true }).map((r) => r.id)).toEqual(['a', 'c']);
  });
});

const lab: LabDetail = {
  id: 'l',
  classId: 'c',
  authorId: 'i',
  title: THREE_WIRE.title,
  summary: THREE_WIRE.summary,
  brief: THREE_WIRE.brief,
  panel: { kind: 'builtIn', id: 'reversing-conveyor' },
  starter: { kind: 'template', programId: null, version: null, document: THREE_WIRE.starter },
  script: THREE_WIRE.script,
  checks: { visible: 5, hidden: 3, maxScore: 11 },
  totalPoints: 11,
  dueAt: '2026-10-01T23:59:00.000Z',
  latePolicy: { kind: 'penalty', penaltyPercent: 20 },
  publishedAt: null,
  templateId: 'three-wire',
  attachments: [],
  demo: false,
  createdAt: '2026-09-01T00:00:00Z',
  updatedAt: '2026-09-01T00:00:00Z',
};

describe('the lab authoring form', () => {
  it('goes back to the same lab fields it came from, and keeps a template’s starter untouched', () => {
    const body = updateFromForm(formFromLab(lab), () => 3);
    expect(body).toEqual({
      title: lab.title,
      summary: lab.summary,
      brief: lab.brief,
      panel: lab.panel,
      script: lab.script,
      totalPoints: 11,
      dueAt: '2026-10-01T23:59:00.000Z',
      latePolicy: { kind: 'penalty', penaltyPercent: 20 },
    });
  });

  it('sends a new starter only when one is picked: an empty program, or a program at its head version', () => {
    const form = formFromLab(lab);
    expect(updateFromForm({ ...form, starterChoice: '' }, () => 3).starter).toEqual({ kind: 'empty' });
    expect(updateFromForm({ ...form, starterChoice: 'p1' }, (id) => (id === 'p1' ? 4 : undefined)).starter).toEqual({ kind: 'program', programId: 'p1', version: 4 });
    expect(updateFromForm({ ...form, dueAtMs: null }, () => 3).dueAt).toBeNull();
  });
});
