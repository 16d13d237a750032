import "server-only";
/**
 * Cache validators for JSON reads (RFC 9110 §8.8.3, §13.1.2; RFC 9111 §5.2.2): every answer carries an ETag
 * and `Cache-Control: private, no-cache` — a browser may keep it but must ask again each time, and a shared
 * cache must not keep it at all — and a request whose If-None-Match names the current tag gets 304 with no
 * body. Callers check the person's access first: a 304 is an answer about the resource too.
 */
import { createHash } from "node:crypto";

export const REVALIDATE_HEADERS = { "cache-control": "private, no-cache", vary: "Accept-Encoding" } as const;

/** Whether the client takes a gzip body: `gzip` (or `x-gzip`, or `*` when gzip is not named) with q > 0. */
export function acceptsGzip(acceptEncoding: string | null): boolean {
  if (!acceptEncoding) return false;
  let star: boolean | null = null;
  for (const part of acceptEncoding.split(",")) {
    const [name, ...params] = part.split(";").map((s) => s.trim().toLowerCase());
    const qParam = params.find((p) => p.startsWith("q="));
    const q = qParam === undefined ? 1 : Number(qParam.slice(2));
    const accepted = Number.isFinite(q) && q > 0;
    if (name === "gzip" || name === "x-gzip") return accepted;
    if (name === "*") star = accepted;
  }
  return star === true;
}

/** If-None-Match against the current tag, by weak comparison (as §13.1.2 says for this header). */
export function noneMatchHits(ifNoneMatch: string | null, etag: string): boolean {
  if (!ifNoneMatch) return false;
  const opaque = (tag: string) => tag.trim().replace(/^W\//, "");
  const current = opaque(etag);
  return ifNoneMatch.split(",").some((tag) => tag.trim() === "*" || opaque(tag) === current);
}

/** A short, URL-safe digest for building tags. */
export function digest(text: string | Buffer): string {
  return createHash("sha256").update(text).digest("base64url").slice(0, 22);
}

export function notModified(etag: string): Response {
  return new Response(null, { status: 304, headers: { etag, ...REVALIDATE_HEADERS } });
}

/**
 * A JSON answer with a weak ETag of its text (weak: the server's compression may re-encode the same JSON), or
 * 304 when the client already holds it. For answers computed per request that are small enough to serialise.
 */
export function jsonWithEtag(request: Request, value: unknown): Response {
  const text = JSON.stringify(value);
  const etag = `W/"${digest(text)}"`;
  if (noneMatchHits(request.headers.get("if-none-match"), etag)) return notModified(etag);
  return new Response(text, { status: 200, headers: { "content-type": "application/json", etag, ...REVALIDATE_HEADERS } });
}
