/**
 * The filters of a lab's student list, carried in the address (`?show=not_started`), so a count on
 * the class overview opens the list already filtered and the filter survives a reload.
 */
import type { LabStanding, LabStudentRow } from '@shared/api/teaching';

export type StudentFilter = 'all' | LabStanding | 'late';
export const STUDENT_FILTERS: readonly StudentFilter[] = ['all', 'not_started', 'in_progress', 'submitted', 'late', 'returned'];

export const FILTER_LABEL = {
  all: 'Everyone',
  not_started: 'Not started',
  in_progress: 'In progress',
  submitted: 'Submitted, not returned',
  late: 'Late',
  returned: 'Returned',
} as const satisfies Record<StudentFilter, string>;

/** The filter a query value names; anything else shows everyone. */
export function filterFrom(value: unknown): StudentFilter {
  return typeof value === 'string' && (STUDENT_FILTERS as readonly string[]).includes(value) ? (value as StudentFilter) : 'all';
}

export function studentListLink(labId: string, filter: StudentFilter): string {
  return `/labs/${encodeURIComponent(labId)}/submissions${filter === 'all' ? '' : `?show=${filter}`}`;
}

export function matchesFilter(row: LabStudentRow, filter: StudentFilter): boolean {
  if (filter === 'all') return true;
  if (filter === 'late') return row.late;
  return row.standing === filter;
}

/**
 * The submissions to review, in the order the list shows them (by student name): what "next" and
 * "previous" walk through on the review page.
 */
export function reviewOrder(rows: readonly LabStudentRow[]): string[] {
  return [...rows]
    .filter((r) => r.submissionId !== null)
    .sort((a, b) => a.student.name.localeCompare(b.student.name) || a.student.email.localeCompare(b.student.email))
    .map((r) => r.submissionId!);
}

/** The submissions before and after `current` in `order`, or null at either end. */
export function neighbours(order: readonly string[], current: string): { previous: string | null; next: string | null; index: number } {
  const index = order.indexOf(current);
  if (index === -1) return { previous: null, next: null, index };
  return { previous: order[index - 1] ?? null, next: order[index + 1] ?? null, index };
}
