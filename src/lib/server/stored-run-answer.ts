import "server-only";
/**
 * The answer of GET /api/runs/:id, `{"run": {…the run's fields…, "results": …}}`, built from the copy of the
 * results stored with the run (db/stored-results.ts) without parsing or serialising them: the run's other
 * fields — small, and some change after the run is stored (verification, stale, the author's name) — are
 * serialised per request and put around the stored bytes. Gzip when the client takes it (one gzip stream,
 * src/lib/server/gzip-splice.ts) and the server can say so (scripts/serve.mjs turns OWN_ENCODING_HEADER into
 * Content-Encoding, which Next itself drops from a route's answer); else the stored bytes inflated, marked
 * no-transform so that no compression on the way changes the bytes the strong ETag names.
 *
 * The ETag is strong: the results' SHA-256 (made when stored) and a digest of the fields around them, with
 * `-gz` on the gzip body (another representation of the same JSON, so another strong tag). A new run, a
 * change of verification or a new scenario version (stale) gives a new tag.
 */
import { constants, inflateRawSync } from "node:zlib";
import type { StoredResults } from "@db/stored-results";
import { gzipAround } from "./gzip-splice";
import { digest, noneMatchHits, notModified, ownBodyHeaders, ownGzip, REVALIDATE_HEADERS, type PlainAnswer, type ReadRequest } from "./http-cache";

export function storedRunAnswer(request: ReadRequest, fields: Record<string, unknown>, stored: StoredResults): PlainAnswer {
  const fieldsJson = JSON.stringify(fields);
  // `{"run":{…fields…,"results":` + stored JSON + `}}`: the fields' closing brace gives way to the results.
  const before = Buffer.from(`{"run":${fieldsJson.slice(0, -1)}${fieldsJson === "{}" ? "" : ","}"results":`, "utf8");
  const after = Buffer.from("}}", "utf8");
  const gzip = ownGzip(request);
  const etag = `"${stored.resultsEtag.slice(0, 22)}.${digest(before)}${gzip ? "-gz" : ""}"`;
  if (noneMatchHits(request.headers.get("if-none-match"), etag)) return notModified(etag);
  const chunks = gzip
    ? gzipAround(before, { deflate: stored.resultsDeflate, crc32: stored.resultsCrc32, length: stored.resultsLength }, after)
    : [before, inflateRawSync(stored.resultsDeflate, { finishFlush: constants.Z_SYNC_FLUSH }), after];
  const body = Buffer.concat(chunks);
  const headers: Record<string, string> = { "content-type": "application/json", etag, ...REVALIDATE_HEADERS, ...ownBodyHeaders(body.length, gzip) };
  if (!gzip) headers["cache-control"] += ", no-transform";
  return { status: 200, headers, body };
}
