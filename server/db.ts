import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres';
import { Pool } from 'pg';
import * as schema from '../db/schema';

/** The Drizzle client with the project's schema. */
export type Database = NodePgDatabase<typeof schema>;

/** A Drizzle client and the pool under it (the pool is closed at shutdown). */
export interface DatabaseHandle {
  /** The Drizzle client. */
  db: Database;
  /** The connection pool. */
  pool: Pool;
}

/** Opens a connection pool to `url` and wraps it in the one Drizzle client. */
export function openDatabase(url: string, max = 10): DatabaseHandle {
  const pool = new Pool({ connectionString: url, max });
  return { db: drizzle(pool, { schema }), pool };
}

/** A transaction handed out by `db.transaction`. */
export type Transaction = Parameters<Parameters<Database['transaction']>[0]>[0];

/** Either the client or a transaction: repositories accept both. */
export type Executor = Database | Transaction;
