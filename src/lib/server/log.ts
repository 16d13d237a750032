import "server-only";
import { randomBytes } from "node:crypto";

/**
 * What the server log may say about an unexpected error: a reference (also given to the client) and a code.
 * A database error gives its SQLSTATE and table/constraint names; any other error its class name and the
 * first stack frames (code locations, no data). Messages are left out on purpose: a driver or library message
 * can quote the values it was given.
 */
export function describeError(e: unknown): string {
  // By name, not instanceof: the bundler may give route and page code separate copies of db/safe-errors.
  if (e instanceof Error && e.name === "DatabaseError") return `${e.name}: ${e.message}`;
  if (e instanceof Error) {
    const frames = (e.stack ?? "").split("\n").filter((l) => l.trim().startsWith("at ")).slice(0, 5).join("\n");
    return `${e.name}${frames ? `\n${frames}` : ""}`;
  }
  return typeof e;
}

export function logServerError(e: unknown, context = "unexpected server error"): string {
  const ref = randomBytes(6).toString("hex");
  console.error(`[pourline] ${context} ref=${ref} ${describeError(e)}`);
  return ref;
}
