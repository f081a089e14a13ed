import { defineConfig } from 'drizzle-kit';

// `npm run db:generate` writes SQL migrations into drizzle/ from the schema; they are applied at start-up.
export default defineConfig({
  dialect: 'postgresql',
  schema: './server/db/schema.ts',
  out: './drizzle',
  driver: 'pglite',
  dbCredentials: { url: './data/pg' },
});
