import "server-only";
/**
 * The client of the National Weather Service web API (format and sources: ./nws-format). Two requests: the
 * points look-up for a latitude/longitude, then the grid's hourly forecast at the `forecastHourly` link it
 * returns. Every request carries the User-Agent the service asks for (the application and a contact), asks
 * for GeoJSON, has a timeout, and is retried with back-off after a timeout, a network failure, HTTP 429 or
 * a 5xx answer (the documentation says a rate-limited request may be retried after about 5 s); a 4xx answer
 * is final. Every failure is a `ForecastError` with a plain sentence; nothing here throws anything else.
 * `FORECAST_BASE_URL` points at the real service (default) or the local fake (scripts/fake-forecast.ts).
 * The hourly link must lie on the same origin as the base URL: the app fetches only where it was told to.
 */
import { hourlySchema, normalizeHourly, pointSchema, type NormalizedForecast } from "./nws-format";

export type ForecastFailure = "timeout" | "unreachable" | "server" | "notCovered" | "malformed";

export class ForecastError extends Error {
  constructor(
    readonly kind: ForecastFailure,
    message: string,
  ) {
    super(message);
  }
}

export interface ClientOptions {
  baseUrl?: string;
  userAgent?: string;
  timeoutMs?: number;
  attempts?: number;
  /** First back-off delay; doubled after each failed attempt. */
  retryBaseMs?: number;
}

export interface FetchedForecast extends NormalizedForecast {
  hourlyUrl: string;
  office: string | null;
  timeZone: string | null;
  place: string | null;
}

const MAX_BODY_BYTES = 5 * 1024 * 1024;
const SERVICE = "The National Weather Service";

export function clientOptionsFromEnv(): Required<ClientOptions> {
  return {
    baseUrl: process.env.FORECAST_BASE_URL || "https://api.weather.gov",
    userAgent: process.env.FORECAST_USER_AGENT || `(Pourline bridge-deck planning, ${process.env.MAIL_FROM || "pourline@localhost"})`,
    timeoutMs: Number(process.env.FORECAST_TIMEOUT_MS || 10_000),
    attempts: Number(process.env.FORECAST_ATTEMPTS || 3),
    retryBaseMs: Number(process.env.FORECAST_RETRY_BASE_MS || 1_000),
  };
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

type Attempt = { ok: true; body: unknown } | { ok: false; retry: boolean; error: ForecastError };

async function once(url: string, o: Required<ClientOptions>): Promise<Attempt> {
  let res: Response;
  try {
    res = await fetch(url, { headers: { "User-Agent": o.userAgent, Accept: "application/geo+json" }, signal: AbortSignal.timeout(o.timeoutMs), redirect: "error" });
  } catch (e) {
    const timedOut = e instanceof Error && (e.name === "TimeoutError" || e.name === "AbortError");
    return timedOut
      ? { ok: false, retry: true, error: new ForecastError("timeout", `${SERVICE} did not answer within ${Math.round(o.timeoutMs / 100) / 10} s.`) }
      : { ok: false, retry: true, error: new ForecastError("unreachable", `${SERVICE} could not be reached.`) };
  }
  let text: string;
  try {
    text = await res.text();
  } catch {
    return { ok: false, retry: true, error: new ForecastError("timeout", `${SERVICE} stopped answering half-way.`) };
  }
  if (!res.ok) {
    let title = "";
    try {
      const problem = JSON.parse(text) as { title?: unknown; detail?: unknown };
      if (typeof problem.title === "string") title = `: ${problem.title.slice(0, 120)}`;
    } catch {}
    if (res.status === 404) return { ok: false, retry: false, error: new ForecastError("notCovered", `${SERVICE} has no forecast for this location (HTTP 404${title}). It covers the United States and its territories.`) };
    const retry = res.status === 429 || res.status >= 500;
    return { ok: false, retry, error: new ForecastError("server", `${SERVICE} answered with an error (HTTP ${res.status}${title}).`) };
  }
  if (text.length > MAX_BODY_BYTES) return { ok: false, retry: false, error: new ForecastError("malformed", `${SERVICE} sent an answer larger than ${MAX_BODY_BYTES / 1024 / 1024} MB.`) };
  try {
    return { ok: true, body: JSON.parse(text) };
  } catch {
    return { ok: false, retry: true, error: new ForecastError("malformed", `${SERVICE} sent an answer that is not valid JSON.`) };
  }
}

async function getJson(url: string, o: Required<ClientOptions>): Promise<unknown> {
  let last: ForecastError | null = null;
  for (let attempt = 1; attempt <= o.attempts; attempt++) {
    const r = await once(url, o);
    if (r.ok) return r.body;
    last = r.error;
    if (!r.retry) break;
    if (attempt < o.attempts) await sleep(o.retryBaseMs * 2 ** (attempt - 1));
  }
  const tries = o.attempts > 1 && last!.kind !== "notCovered" ? ` (tried ${o.attempts} times)` : "";
  throw new ForecastError(last!.kind, last!.message.replace(/\.$/, `${tries}.`));
}

function fieldsOf(error: { issues: { path: PropertyKey[]; message: string }[] }): string {
  const i = error.issues[0];
  return `${i.path.map(String).join(".") || "the answer"} ${i.message}`;
}

/** The latitude/longitude as the service wants them: at most 4 decimals. */
export function pointPath(latitude: number, longitude: number): string {
  const r = (x: number) => String(Math.round(x * 1e4) / 1e4);
  return `/points/${r(latitude)},${r(longitude)}`;
}

export async function fetchHourlyForecast(latitude: number, longitude: number, options: ClientOptions = {}): Promise<FetchedForecast> {
  const o = { ...clientOptionsFromEnv(), ...options };
  const base = o.baseUrl.replace(/\/+$/, "");
  const point = pointSchema.safeParse(await getJson(`${base}${pointPath(latitude, longitude)}`, o));
  if (!point.success) throw new ForecastError("malformed", `${SERVICE} sent a location answer Pourline cannot read (${fieldsOf(point.error)}).`);
  const p = point.data.properties;
  let hourlyUrl: URL;
  try {
    hourlyUrl = new URL(p.forecastHourly);
  } catch {
    throw new ForecastError("malformed", `${SERVICE} sent an hourly forecast link that is not a web address.`);
  }
  if (hourlyUrl.origin !== new URL(base).origin) throw new ForecastError("malformed", `${SERVICE} sent an hourly forecast link to another site (${hourlyUrl.origin}); it is not followed.`);
  const hourly = hourlySchema.safeParse(await getJson(hourlyUrl.toString(), o));
  if (!hourly.success) throw new ForecastError("malformed", `${SERVICE} sent an hourly forecast Pourline cannot read (${fieldsOf(hourly.error)}).`);
  const rel = p.relativeLocation?.properties;
  return {
    ...normalizeHourly(hourly.data),
    hourlyUrl: hourlyUrl.toString(),
    office: p.gridId ? `${p.gridId} ${p.gridX ?? "?"},${p.gridY ?? "?"}` : null,
    timeZone: p.timeZone ?? null,
    place: rel?.city ? `${rel.city}${rel.state ? `, ${rel.state}` : ""}` : null,
  };
}
