/**
 * What the app actually exposes, read from the source tree rather than listed by hand: every route-method under
 * src/app/api, every page under src/app/(app) and every server action. The authorization tests compare these
 * lists with their expectation tables, so a new route, page or action without a row fails the suite.
 */
import { readdirSync, readFileSync } from "node:fs";
import { join, relative, sep } from "node:path";
import { fileURLToPath } from "node:url";

export const SRC_APP = fileURLToPath(new URL("../../src/app", import.meta.url));
const SRC = fileURLToPath(new URL("../../src", import.meta.url));
export const HTTP_METHODS = ["GET", "POST", "PUT", "PATCH", "DELETE"] as const;
export type HttpMethod = (typeof HTTP_METHODS)[number];

function filesNamed(dir: string, name: string): string[] {
  return (readdirSync(dir, { recursive: true }) as string[]).filter((f) => f.split(sep).at(-1) === name).map((f) => join(dir, f));
}

/** "src/app/api/scenarios/[scenarioId]/route.ts" → "/api/scenarios/[scenarioId]"; route groups "(x)" vanish from URLs. */
function urlOf(file: string): string {
  const parts = relative(SRC_APP, file).split(sep).slice(0, -1).filter((p) => !/^\(.*\)$/.test(p));
  return "/" + parts.join("/");
}

/** The HTTP methods a route module exports, as `export const GET = …` or `export async function GET(…)`. */
export function exportedMethods(source: string): HttpMethod[] {
  return HTTP_METHODS.filter((m) => new RegExp(`export\\s+(const\\s+${m}\\b|(async\\s+)?function\\s+${m}\\b)`).test(source));
}

/** Every "METHOD /api/path/[param]" the file system defines. */
export function discoverApiRouteMethods(): string[] {
  const keys: string[] = [];
  for (const file of filesNamed(join(SRC_APP, "api"), "route.ts")) {
    const methods = exportedMethods(readFileSync(file, "utf8"));
    if (methods.length === 0) throw new Error(`${file} exports no HTTP method the inventory knows`);
    for (const m of methods) keys.push(`${m} ${urlOf(file)}`);
  }
  return keys.sort();
}

/** Every signed-in page: "/projects/[projectId]/members" for src/app/(app)/projects/[projectId]/members/page.tsx. */
export function discoverAppPages(): string[] {
  return filesNamed(join(SRC_APP, "(app)"), "page.tsx").map(urlOf).sort();
}

/**
 * Every server action, as "src/…/actions.ts#exportName". A file whose first statement is "use server" makes each
 * exported async function an action; an inline "use server" inside a function is reported as "file#(inline)" so
 * it cannot slip past the table unnoticed.
 */
export function discoverServerActions(): string[] {
  const out: string[] = [];
  for (const rel of readdirSync(SRC, { recursive: true }) as string[]) {
    if (!/\.(ts|tsx)$/.test(rel)) continue;
    const text = readFileSync(join(SRC, rel), "utf8");
    if (!/["']use server["']/.test(text)) continue;
    const file = `src/${rel.split(sep).join("/")}`;
    const topLevel = /^\s*(\/\/[^\n]*\n|\/\*[\s\S]*?\*\/\s*)*["']use server["']/.test(text);
    if (!topLevel) {
      out.push(`${file}#(inline)`);
      continue;
    }
    for (const m of text.matchAll(/export\s+async\s+function\s+(\w+)/g)) out.push(`${file}#${m[1]}`);
    for (const m of text.matchAll(/export\s+const\s+(\w+)\s*=\s*async/g)) out.push(`${file}#${m[1]}`);
  }
  return out.sort();
}

/** Fills "[param]" segments from a map; a missing value is a bug in the test's fixture. */
export function fillPath(template: string, params: Record<string, string>): string {
  return template.replace(/\[(\w+)\]/g, (_, name: string) => {
    if (!(name in params)) throw new Error(`no value for [${name}] in ${template}`);
    return encodeURIComponent(params[name]);
  });
}
