import "server-only";
/**
 * The checks behind `readJson` (./errors), which every route uses to read JSON: a byte limit checked on
 * Content-Length and again while reading (a missing or lying header cannot get past it), a nesting limit
 * checked on the text before parsing, and no string or key that PostgreSQL cannot store or a person cannot
 * see (NUL and other control characters, broken UTF-16).
 */
import { formatPath, type FieldProblem } from "@sim/schema";

/** Bodies of ordinary requests. A scenario at every format limit is well under 200 kB. */
export const MAX_JSON_BYTES = 1024 * 1024;
/** Deeper than any request of the API (a scenario is 7 levels, a run summary 6). */
export const MAX_JSON_DEPTH = 32;

/** The body as bytes, or "too_large" as soon as it is known to exceed `maxBytes` (reading stops there). */
export async function readBodyBytes(req: Request, maxBytes: number): Promise<Uint8Array | "too_large"> {
  const declared = Number(req.headers.get("content-length"));
  if (Number.isFinite(declared) && declared > maxBytes) return "too_large";
  if (!req.body) return new Uint8Array(0);
  const reader = req.body.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > maxBytes) {
      await reader.cancel().catch(() => {});
      return "too_large";
    }
    chunks.push(value);
  }
  const out = new Uint8Array(total);
  let at = 0;
  for (const c of chunks) {
    out.set(c, at);
    at += c.byteLength;
  }
  return out;
}

/** Whether JSON text nests arrays/objects deeper than `limit` (brackets inside strings do not count). */
export function jsonDepthExceeds(text: string, limit: number): boolean {
  let depth = 0;
  let inString = false;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (inString) {
      if (c === 92 /* \ */) i++;
      else if (c === 34 /* " */) inString = false;
    } else if (c === 34) inString = true;
    else if (c === 123 /* { */ || c === 91 /* [ */) {
      if (++depth > limit) return true;
    } else if (c === 125 /* } */ || c === 93 /* ] */) depth--;
  }
  return false;
}

// Tab, line feed and carriage return are allowed here (descriptions have lines); each field's schema decides further.
const CONTROL = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F]/;
const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

function characterProblem(s: string): string | null {
  const m = CONTROL.exec(s);
  if (m) {
    const code = `U+${m[0].charCodeAt(0).toString(16).toUpperCase().padStart(4, "0")}`;
    return m[0] === "\u0000" ? "must not contain the NUL character (U+0000)" : `must not contain control characters (found ${code})`;
  }
  if (LONE_SURROGATE.test(s)) return "must not contain a broken character (a lone UTF-16 surrogate)";
  return null;
}

interface Node {
  v: unknown;
  key: PropertyKey | null;
  parent: Node | null;
}

function pathOf(node: Node, lastKey?: string): string {
  const parts: PropertyKey[] = lastKey === undefined ? [] : [lastKey];
  for (let n: Node | null = node; n && n.key !== null; n = n.parent) parts.push(n.key);
  return parts.length ? formatPath(parts.reverse()) : "(body)";
}

/**
 * Every string value and key of a parsed JSON value that cannot be stored or shown, with its path (at most
 * `max`). Iterative with parent links (no recursion, no path copies), so any nesting is walked in linear time.
 */
export function unsafeStrings(value: unknown, max = 100): FieldProblem[] {
  const out: FieldProblem[] = [];
  const stack: Node[] = [{ v: value, key: null, parent: null }];
  while (stack.length && out.length < max) {
    const node = stack.pop()!;
    const v = node.v;
    if (typeof v === "string") {
      const p = characterProblem(v);
      if (p) out.push({ path: pathOf(node), message: p });
    } else if (Array.isArray(v)) {
      for (let i = v.length - 1; i >= 0; i--) stack.push({ v: v[i], key: i, parent: node });
    } else if (v && typeof v === "object") {
      const keys = Object.keys(v);
      for (let i = keys.length - 1; i >= 0; i--) {
        const k = keys[i];
        const p = characterProblem(k);
        if (p) out.push({ path: pathOf(node, k.replace(new RegExp(CONTROL, "g"), "?")), message: `field name ${p}` });
        else stack.push({ v: (v as Record<string, unknown>)[k], key: k, parent: node });
      }
    }
  }
  return out;
}
