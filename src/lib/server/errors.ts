import "server-only";
import { NextResponse } from "next/server";
import { z } from "zod";
import { formatPath, type FieldProblem } from "@sim/schema";
import { logServerError } from "./log";
import { fieldLabel } from "@sim/field-labels";
import { jsonDepthExceeds, MAX_JSON_BYTES, MAX_JSON_DEPTH, readBodyBytes, unsafeStrings } from "./json-body";

export type ErrorCode = "bad_request" | "unauthorized" | "forbidden" | "not_found" | "conflict" | "too_many" | "too_large" | "unsupported";

const STATUS: Record<ErrorCode, number> = {
  bad_request: 400,
  unauthorized: 401,
  forbidden: 403,
  not_found: 404,
  conflict: 409,
  too_large: 413,
  unsupported: 415,
  too_many: 429,
};

/** The one error type of the server: a code, a plain message for people, and optional field problems. */
export class AppError extends Error {
  constructor(
    readonly code: ErrorCode,
    message: string,
    readonly fields: FieldProblem[] = [],
    readonly extra: Record<string, unknown> = {},
  ) {
    super(message);
  }
  get status() {
    return STATUS[this.code];
  }
  /**
   * `{ error, code, fields: [{ path, label, message }], moreProblems?, ...extra }`: the first
   * MAX_LISTED_PROBLEMS problems, each with its path and its label in words, and how many more there were.
   */
  toResponse() {
    const more = this.fields.length - MAX_LISTED_PROBLEMS;
    const fields = this.fields.slice(0, MAX_LISTED_PROBLEMS).map((f) => ({ path: f.path, label: fieldLabel(f.path), message: f.message }));
    const error = more > 0 ? `${this.message} The first ${MAX_LISTED_PROBLEMS} problems are listed (and ${more.toLocaleString("en-US")} more problems).` : this.message;
    return NextResponse.json({ error, code: this.code, fields, ...(more > 0 ? { moreProblems: more } : {}), ...this.extra }, { status: this.status });
  }
}

/** A refusal lists at most this many problems (200,000 bad dates must not make a 24 MB answer). */
export const MAX_LISTED_PROBLEMS = 100;

/** zod issues as field problems; an unknown field is named by its own path. */
export function zodProblems(error: z.ZodError): FieldProblem[] {
  return error.issues.flatMap((i) =>
    i.code === "unrecognized_keys"
      ? i.keys.map((k) => ({ path: formatPath([...i.path, k]), message: "is not a known field (unknown fields are refused)" }))
      : [{ path: formatPath(i.path), message: i.message }],
  );
}

export function badRequest(fields: FieldProblem[], message = "Some fields need attention.") {
  return new AppError("bad_request", message, fields);
}

/**
 * Wraps a route handler: AppErrors become their response; anything else becomes a plain 500 carrying a
 * reference, and the log gets that reference with a code — never the error's message or properties, which for
 * a failed query could hold its values (session keys, scenario bodies).
 */
export function handler<A extends unknown[]>(fn: (...args: A) => Promise<Response>) {
  return async (...args: A): Promise<Response> => {
    try {
      return await fn(...args);
    } catch (e) {
      return errorResponse(e);
    }
  };
}

/** The answer to a route's failure (see handler). */
export function errorResponse(e: unknown): Response {
  if (e instanceof AppError) return e.toResponse();
  const ref = logServerError(e);
  return NextResponse.json({ error: `Something went wrong on the server. Try again; if it keeps happening, quote reference ${ref}.`, code: "server_error", ref, fields: [] }, { status: 500 });
}

/**
 * Reads and checks a JSON body for a route: 413 over `maxBytes` (1 MB unless the route says otherwise), 400
 * for text that is not UTF-8 or JSON, nests deeper than MAX_JSON_DEPTH, carries control characters or
 * broken characters in any string or key, or does not fit `schema` — each with the fields named.
 */
export async function readJson<T extends z.ZodType>(req: Request, schema: T, opts: { maxBytes?: number } = {}): Promise<z.output<T>> {
  const maxBytes = opts.maxBytes ?? MAX_JSON_BYTES;
  const bytes = await readBodyBytes(req, maxBytes);
  // Small limits in KB: "0 MB" would say nothing at all.
  const mb = maxBytes >= 1024 * 1024 ? `${(maxBytes / 1024 / 1024).toLocaleString("en-US", { maximumFractionDigits: 1 })} MB` : `${Math.floor(maxBytes / 1024).toLocaleString("en-US")} KB`;
  if (bytes === "too_large") throw new AppError("too_large", `The request is larger than ${mb}; nothing was saved.`, [{ path: "(body)", message: `must be at most ${mb}` }]);
  let text: string;
  try {
    text = new TextDecoder("utf-8", { fatal: true }).decode(bytes);
  } catch {
    throw badRequest([{ path: "(body)", message: "must be UTF-8 text" }], "The request body is not UTF-8 text.");
  }
  if (jsonDepthExceeds(text, MAX_JSON_DEPTH)) {
    throw badRequest([{ path: "(body)", message: `must not nest more than ${MAX_JSON_DEPTH} levels` }], `The request body is nested more than ${MAX_JSON_DEPTH} levels deep.`);
  }
  let body: unknown;
  try {
    body = JSON.parse(text);
  } catch {
    throw badRequest([{ path: "(body)", message: "must be valid JSON" }], "The request body is not valid JSON.");
  }
  const unsafe = unsafeStrings(body, Infinity);
  if (unsafe.length) throw badRequest(unsafe, "Some fields contain characters that cannot be stored; nothing was saved.");
  const parsed = schema.safeParse(body);
  if (!parsed.success) throw badRequest(zodProblems(parsed.error));
  return parsed.data;
}
