/** `GET /api/health`. */
import { z } from 'zod';

export const HealthResponseSchema = z.object({
  ok: z.literal(true),
  /** The database driver in use. */
  db: z.enum(['pglite', 'postgres']),
  /** The product version from package.json. */
  version: z.string(),
});
export type HealthResponse = z.infer<typeof HealthResponseSchema>;
