/** Filtering of the submissions table beyond its column filters: a student search and "latest only". */
import { SUBMISSION_STATUSES, type SubmissionRow } from '@shared/api/labs';

export interface SubmissionFilter {
  /** Part of a name or e-mail, any case; blank = everyone. */
  student: string;
  /** Only each student's newest submission. */
  latestOnly: boolean;
}

/** The rows that pass the filter, in their order. */
export function filterSubmissions(rows: readonly SubmissionRow[], filter: SubmissionFilter): SubmissionRow[] {
  const needle = filter.student.trim().toLowerCase();
  return rows.filter(
    (r) => (!filter.latestOnly || r.latest) && (needle === '' || r.student.name.toLowerCase().includes(needle) || r.student.email.toLowerCase().includes(needle)),
  );
}

/** The status column's filter choices. */
export const STATUS_FILTERS = SUBMISSION_STATUSES.map((s) => ({ label: s, value: s }));
