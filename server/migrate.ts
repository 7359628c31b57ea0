import { join } from 'node:path';
import { migrate } from 'drizzle-orm/node-postgres/migrator';
import type { Database } from './db';
import { projectRoot } from './project-root';

/** Applies the committed migrations in `db/migrations` that the database has not seen. */
export async function runMigrations(db: Database): Promise<void> {
  await migrate(db, { migrationsFolder: join(projectRoot(), 'db', 'migrations') });
}
