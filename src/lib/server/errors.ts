import "server-only";
import { NextResponse } from "next/server";
import { z } from "zod";
import { formatPath, type FieldProblem } from "@sim/schema";
import { logServerError } from "./log";

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
  toResponse() {
    return NextResponse.json({ error: this.message, code: this.code, fields: this.fields, ...this.extra }, { status: this.status });
  }
}

export function zodProblems(error: z.ZodError): FieldProblem[] {
  return error.issues.map((i) => ({ path: formatPath(i.path), message: i.message }));
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
      if (e instanceof AppError) return e.toResponse();
      const ref = logServerError(e);
      return NextResponse.json({ error: `Something went wrong on the server. Try again; if it keeps happening, quote reference ${ref}.`, code: "server_error", ref, fields: [] }, { status: 500 });
    }
  };
}

export async function readJson<T extends z.ZodType>(req: Request, schema: T): Promise<z.output<T>> {
  let body: unknown;
  try {
    body = await req.json();
  } catch {
    throw badRequest([{ path: "(body)", message: "must be valid JSON" }], "The request body is not valid JSON.");
  }
  const parsed = schema.safeParse(body);
  if (!parsed.success) throw badRequest(zodProblems(parsed.error));
  return parsed.data;
}
