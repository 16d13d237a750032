/**
 * Database errors without the query's values. drizzle-orm wraps every failed query in an error whose message
 * is "Failed query: <sql> params: <values>", and the driver's own error carries the row's values in its
 * `detail` — so logging either would write session keys, e-mail addresses or whole scenario bodies into the
 * server log. Every query of this app's pools fails instead with a DatabaseError that holds only the SQLSTATE
 * (or the driver's connection code) and the table and constraint names. Installed by db/client.ts.
 */
import { PgPreparedQuery } from "drizzle-orm/pg-core";

export class DatabaseError extends Error {
  override name = "DatabaseError";
  constructor(
    readonly code: string,
    readonly table: string | null = null,
    readonly constraint: string | null = null,
  ) {
    super(`Database query failed (${[code, table && `table ${table}`, constraint && `constraint ${constraint}`].filter(Boolean).join(", ")})`);
  }
}

const SAFE_NAME = /^[A-Za-z0-9_.-]{1,80}$/;
const safe = (v: unknown) => (typeof v === "string" && SAFE_NAME.test(v) ? v : null);

/** The same failure, described by its code and names only. */
export function scrubDatabaseError(e: unknown): DatabaseError {
  if (e instanceof DatabaseError) return e;
  // drizzle's wrapper keeps the driver's error as `cause`.
  const inner = (e as { cause?: unknown })?.cause ?? e;
  const fields = (inner ?? {}) as { code?: unknown; table_name?: unknown; constraint_name?: unknown };
  return new DatabaseError(safe(fields.code) ?? "unknown", safe(fields.table_name), safe(fields.constraint_name));
}

const marker = Symbol.for("pourline.safeDatabaseErrors");
type Patchable = { queryWithCache: (...args: unknown[]) => Promise<unknown>; [marker]?: true };

export function installSafeDatabaseErrors() {
  const proto = PgPreparedQuery.prototype as unknown as Patchable;
  if (proto[marker]) return;
  // An internal method of drizzle-orm (pinned in package.json); fail loudly rather than log values silently.
  if (typeof proto.queryWithCache !== "function") throw new Error("drizzle-orm no longer has PgPreparedQuery.queryWithCache: update db/safe-errors.ts");
  const original = proto.queryWithCache;
  proto.queryWithCache = async function (this: unknown, ...args: unknown[]) {
    try {
      return await original.apply(this, args);
    } catch (e) {
      throw scrubDatabaseError(e);
    }
  };
  proto[marker] = true;
}
