/**
 * Calling a server action over HTTP the way the framework's client does: a POST to the page with the action's id
 * in the `Next-Action` header and the arguments encoded as React encodes a reply (a FormData argument's fields
 * travel under a "_<n>_" prefix and are referred to as "$K<n>"). Action ids come from the build's
 * server-reference manifest, which names each action's file and export.
 */
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { APP_URL } from "./app";

interface ManifestEntry {
  filename: string;
  exportedName: string;
}

/** "src/app/(auth)/signin/actions.ts#signInAction" → the id the running build gave it. */
export function builtActionIds(): Map<string, string> {
  const root = fileURLToPath(new URL("../..", import.meta.url));
  const file = join(root, process.env.POURLINE_DIST_DIR ?? ".next", "server", "server-reference-manifest.json");
  const manifest = JSON.parse(readFileSync(file, "utf8")) as { node: Record<string, ManifestEntry> };
  const out = new Map<string, string>();
  for (const [id, entry] of Object.entries(manifest.node)) out.set(`${entry.filename}#${entry.exportedName}`, id);
  return out;
}

export interface ActionReply {
  status: number;
  /** Where the action sent the browser, or null when it answered in place. */
  redirect: string | null;
  text: string;
  setCookie: string | null;
}

function encodeArgs(args: unknown[]): FormData {
  const body = new FormData();
  let next = 1;
  const encoded = args.map((a) => {
    if (!(a instanceof FormData)) return a;
    const ref = next++;
    for (const [k, v] of a.entries()) body.append(`_${ref}_${k}`, v);
    return `$K${ref.toString(16)}`;
  });
  body.set("0", JSON.stringify(encoded));
  return body;
}

export async function invokeAction(page: string, actionId: string, args: unknown[], opts: { cookie?: string | null; origin?: string | null } = {}): Promise<ActionReply> {
  const headers: Record<string, string> = { "next-action": actionId, accept: "text/x-component" };
  if (opts.cookie) headers.cookie = opts.cookie;
  if (opts.origin !== null) headers.origin = opts.origin ?? APP_URL;
  const res = await fetch(`${APP_URL}${page}`, { method: "POST", headers, body: encodeArgs(args), redirect: "manual" });
  const text = await res.text();
  const raw = res.headers.get("x-action-redirect") ?? res.headers.get("location");
  return { status: res.status, redirect: raw ? raw.split(";")[0] : null, text, setCookie: res.headers.get("set-cookie") };
}

export function form(fields: Record<string, string>): FormData {
  const f = new FormData();
  for (const [k, v] of Object.entries(fields)) f.set(k, v);
  return f;
}
