/** The @tanstack/vue-query cache keys, in one place so invalidation cannot miss one. */
export const queryKeys = {
  programs: ['programs'] as const,
  program: (id: string) => ['programs', id] as const,
  versions: (id: string) => ['programs', id, 'versions'] as const,
  version: (id: string, n: number) => ['programs', id, 'versions', n] as const,
  diff: (id: string, from: number, to: number) => ['programs', id, 'diff', from, to] as const,
  classes: ['classes'] as const,
  users: ['users'] as const,
};
