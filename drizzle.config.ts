import { defineConfig } from 'drizzle-kit';

export default defineConfig({
  dialect: 'postgresql',
  schema: './db/schema/index.ts',
  out: './db/migrations',
  strict: true,
  // pg-boss keeps its queue in its own schema; migrations only manage ours.
  schemaFilter: ['public'],
  verbose: true,
  dbCredentials: {
    url: process.env['DATABASE_URL'] ?? 'postgres://postgres@127.0.0.1:54329/cellsmith',
  },
});
