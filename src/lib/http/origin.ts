/**
 * The cross-site request check. A state-changing request (any method but GET/HEAD/OPTIONS — API calls and
 * server actions alike) must carry an Origin equal, in scheme, host and port, to one of the app's own
 * origins: APP_BASE_URL when set (plus POURLINE_ALLOWED_ORIGINS), otherwise the origin this server is being
 * reached at (its Host with the scheme it sees; forwarded host and scheme only from a trusted proxy).
 */
export const SAFE_METHODS = new Set(["GET", "HEAD", "OPTIONS"]);

export function originOf(value: string | null | undefined): string | null {
  if (!value) return null;
  try {
    const u = new URL(value);
    return u.protocol === "http:" || u.protocol === "https:" ? u.origin : null;
  } catch {
    return null;
  }
}

export function ownOrigins(input: { appBaseUrl?: string; extra?: string; scheme: string; host: string | null }): string[] {
  const configured = [input.appBaseUrl, ...(input.extra ?? "").split(",")].map((v) => originOf(v?.trim())).filter((o): o is string => !!o);
  if (configured.length) return configured;
  const seen = input.host ? originOf(`${input.scheme.replace(/:$/, "")}://${input.host}`) : null;
  return seen ? [seen] : [];
}

/** Whether `origin` (the request's Origin header) is exactly one of `allowed`. */
export function sameOrigin(origin: string | null, allowed: string[]): boolean {
  // originOf normalises default ports and case, so "HTTP://Host:80" equals "http://host"; "null" is no origin.
  const o = originOf(origin);
  return !!o && allowed.includes(o);
}
