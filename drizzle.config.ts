import { defineConfig } from 'drizzle-kit';

/** drizzle-kit: `npm run db:generate` writes a migration for each change to the schema. */
export default defineConfig({
  dialect: 'sqlite',
  schema: './libs/db/src/schema.ts',
  out: './libs/db/migrations',
  strict: true,
  verbose: true,
});
