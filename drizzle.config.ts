/** drizzle-kit: `npm run db:generate` writes SQL migrations from server/db/schema.ts. The server applies them at boot. */
import { defineConfig } from 'drizzle-kit';

export default defineConfig({
  dialect: 'postgresql',
  driver: 'pglite',
  schema: './server/db/schema.ts',
  out: './server/db/migrations',
});
