import "server-only";
/**
 * Cache validators for JSON reads (RFC 9110 §8.8.3, §13.1.2; RFC 9111 §5.2.2): every answer carries an ETag
 * and `Cache-Control: private, no-cache` — a browser may keep it but must ask again each time, and a shared
 * cache must not keep it at all — and a request whose If-None-Match names the current tag gets 304 with no
 * body. Callers check the person's access first: a 304 is an answer about the resource too.
 */
import { createHash } from "node:crypto";
import { gzipSync } from "node:zlib";
import { LRUCache } from "lru-cache";

/**
 * Next drops Content-Encoding and Content-Length from a route's answer, so a route that compresses its own body
 * names the encoding and the length in these private headers and scripts/serve.mjs (which sets
 * POURLINE_OWN_ENCODING) turns them into the real ones; that also keeps Next's own compression off the body,
 * and a known length lets the answer go out in one write, unchunked. Under `next dev` there is no such
 * server, and routes send plain JSON. Same names in scripts/serve.mjs.
 */
export const OWN_ENCODING_HEADER = "x-pourline-content-encoding";
export const OWN_LENGTH_HEADER = "x-pourline-content-length";

/** Whether to answer `request` with a body this route gzipped itself (see OWN_ENCODING_HEADER). */
export function ownGzip(request: ReadRequest): boolean {
  return process.env.POURLINE_OWN_ENCODING === "1" && acceptsGzip(request.headers.get("accept-encoding"));
}

/** The private headers naming a body of `length` bytes (gzip or not) for scripts/serve.mjs; none without it. */
export function ownBodyHeaders(length: number, gzip: boolean): Record<string, string> {
  if (process.env.POURLINE_OWN_ENCODING !== "1") return {};
  return { [OWN_LENGTH_HEADER]: String(length), ...(gzip ? { [OWN_ENCODING_HEADER]: "gzip" } : {}) };
}

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

/** What an answer needs of its request: its headers (a Request has them; so has the fast path's stand-in). */
export interface ReadRequest {
  headers: { get(name: string): string | null };
}

/**
 * An answer as status, headers and bytes: what the read answers build. A route handler sends it as a Response
 * (answerResponse); scripts/serve.mjs writes it to the socket as it is (src/lib/server/fast-reads.ts), without
 * building a Response and reading its body back.
 */
export interface PlainAnswer {
  status: number;
  headers: Record<string, string>;
  body: Buffer<ArrayBuffer> | null;
}

export function answerResponse(answer: PlainAnswer): Response {
  const { body } = answer;
  return new Response(body ? new Uint8Array(body.buffer, body.byteOffset, body.length) : null, { status: answer.status, headers: answer.headers });
}

export function notModified(etag: string): PlainAnswer {
  return { status: 304, headers: { etag, ...REVALIDATE_HEADERS }, body: null };
}

// The gzip of a JSON answer by its tag (the tag is the SHA-256 of the text, so the bytes are the same for
// whoever asks): a list read again unchanged is not compressed again. Bounded in bytes.
const gzipByTag = new LRUCache<string, Buffer<ArrayBuffer>>({ maxSize: 4 * 1024 * 1024, maxEntrySize: 1024 * 1024, sizeCalculation: (b) => Math.max(1, b.length) });

/**
 * A JSON answer with a weak ETag of its text (weak: the plain and the gzip body are the same JSON), or 304 when
 * the client already holds it. For answers computed per request that are small enough to serialise. Gzipped
 * here, in one call, when the client takes it: cheaper than Next's streaming compression for a body this size.
 */
export function jsonWithEtag(request: ReadRequest, value: unknown): PlainAnswer {
  const text = Buffer.from(JSON.stringify(value), "utf8");
  const etag = `W/"${digest(text)}"`;
  if (noneMatchHits(request.headers.get("if-none-match"), etag)) return notModified(etag);
  const gzip = ownGzip(request);
  let body = text;
  if (gzip) {
    body = gzipByTag.get(etag) ?? gzipSync(text);
    gzipByTag.set(etag, body);
  }
  return { status: 200, headers: { "content-type": "application/json", etag, ...REVALIDATE_HEADERS, ...ownBodyHeaders(body.length, gzip) }, body };
}
