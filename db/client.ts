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
  /** This pool's prepared queries by name (see `prepared`). */
  prepared: Map<string, unknown>;
}

const globalForDb = globalThis as unknown as { __pourlineDb?: Pool };

export function databaseUrl(): string {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error("DATABASE_URL is not set. Start the app with `npm start`, which sets it.");
  return url;
}

export function createPool(url: string, max = 10): Pool {
  const sql = postgres(url, { max, onnotice: () => {} });
  return { sql, db: drizzle(sql, { schema }), prepared: new Map() };
}

/** Lazily opened so that importing a module never needs a database (the build does not have one). */
export function getDb(): Database {
  if (!globalForDb.__pourlineDb) globalForDb.__pourlineDb = createPool(databaseUrl());
  return globalForDb.__pourlineDb.db;
}

/**
 * A named prepared query of the app's pool, built on first use. For the queries every request makes: a plain
 * drizzle query is sent unnamed, and with parameters the driver first asks the server to describe it — two
 * round trips a call — and builds its SQL again each time; a prepared one is built once, described once per
 * connection, then sent and answered in one round trip. Kept with the pool, so a new pool prepares afresh.
 */
export function prepared<T>(name: string, build: (db: Database) => T): T {
  getDb();
  const pool = globalForDb.__pourlineDb!;
  if (!pool.prepared.has(name)) pool.prepared.set(name, build(pool.db));
  return pool.prepared.get(name) as T;
}

export async function closeDb(): Promise<void> {
  const pool = globalForDb.__pourlineDb;
  globalForDb.__pourlineDb = undefined;
  if (pool) await pool.sql.end({ timeout: 5 });
}
