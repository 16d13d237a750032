/**
 * The one PostgreSQL connection pool. Only files under db/ import the driver; everything else goes through
 * the named query functions in db/queries/.
 */
import { drizzle, type PostgresJsDatabase } from "drizzle-orm/postgres-js";
import postgres from "postgres";
import * as schema from "./schema";
import { installSafeDatabaseErrors } from "./safe-errors";

// Query values never reach an error message (and so never a log): see db/safe-errors.ts.
installSafeDatabaseErrors();

export type Database = PostgresJsDatabase<typeof schema>;

interface Pool {
  sql: postgres.Sql;
  db: Database;
}

const globalForDb = globalThis as unknown as { __pourlineDb?: Pool };

export function databaseUrl(): string {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error("DATABASE_URL is not set. Start the app with `npm start`, which sets it.");
  return url;
}

export function createPool(url: string, max = 10): Pool {
  const sql = postgres(url, { max, onnotice: () => {} });
  return { sql, db: drizzle(sql, { schema }) };
}

/** Lazily opened so that importing a module never needs a database (the build does not have one). */
export function getDb(): Database {
  if (!globalForDb.__pourlineDb) globalForDb.__pourlineDb = createPool(databaseUrl());
  return globalForDb.__pourlineDb.db;
}

export async function closeDb(): Promise<void> {
  const pool = globalForDb.__pourlineDb;
  globalForDb.__pourlineDb = undefined;
  if (pool) await pool.sql.end({ timeout: 5 });
}
