/** The browser's side of the API: JSON in and out, errors as one typed class carrying the field problems. */
/** One refused field as every 400/413 answer lists it: `label` is the path in words ("Deck › Survey ranges"). */
export interface FieldProblem {
  path: string;
  label?: string;
  message: string;
}

export class ApiError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly fields: FieldProblem[] = [],
    readonly body: Record<string, unknown> = {},
  ) {
    super(message);
  }
}

export async function api<T>(path: string, init: { method?: string; body?: unknown } = {}): Promise<T> {
  const res = await fetch(path, {
    method: init.method ?? "GET",
    headers: init.body === undefined ? undefined : { "content-type": "application/json" },
    body: init.body === undefined ? undefined : JSON.stringify(init.body),
    credentials: "same-origin",
  });
  const text = await res.text();
  let json: Record<string, unknown> = {};
  try {
    json = text ? JSON.parse(text) : {};
  } catch {
    // A non-JSON error page: keep the status, say it plainly.
  }
  if (!res.ok) {
    throw new ApiError(res.status, typeof json.error === "string" ? json.error : `The server answered ${res.status}.`, (json.fields as FieldProblem[]) ?? [], json);
  }
  return json as T;
}

/** A form upload (multipart: a file and its fields), answered in JSON like every other call. */
export async function uploadFile<T>(path: string, data: FormData): Promise<T> {
  const res = await fetch(path, { method: "POST", body: data, credentials: "same-origin" });
  const json = await res.json().catch(() => ({}));
  if (!res.ok) throw new ApiError(res.status, json.error ?? `The server answered ${res.status}.`, json.fields ?? [], json);
  return json as T;
}
