/**
 * The stored copy of a run's results, made once when the run is stored (and once for an older row, on its
 * first read), so that GET /api/runs/:id never parses, serialises or compresses the 200 kB of charts data:
 *   - `resultsDeflate`: the results JSON raw-deflated (RFC 1951) and ended with a sync flush instead of a final
 *     block, so the route can put the run's small, changing part (verification, stale …) before it and close
 *     the stream after it, making one gzip body without touching these bytes (src/lib/server/gzip-splice.ts);
 *   - `resultsCrc32`, `resultsLength`: what the gzip trailer needs of these bytes;
 *   - `resultsEtag`: SHA-256 of the JSON (base64url), the results' part of the answer's ETag.
 * No server-only import: the demo seed stores its runs with it too.
 */
import { createHash } from "node:crypto";
import { constants, crc32, deflateRawSync } from "node:zlib";

export interface StoredResults {
  resultsDeflate: Buffer;
  resultsCrc32: number;
  resultsLength: number;
  resultsEtag: string;
}

/** `results` exactly as the run's readers get it: JSON.stringify of what is stored in the `results` column. */
export function storedResultsOf(results: unknown): StoredResults {
  const json = Buffer.from(JSON.stringify(results), "utf8");
  return {
    // Level 9: paid once per run, and every reader after that gets the smaller body.
    resultsDeflate: deflateRawSync(json, { level: 9, finishFlush: constants.Z_SYNC_FLUSH }),
    resultsCrc32: crc32(json),
    resultsLength: json.length,
    resultsEtag: createHash("sha256").update(json).digest("base64url"),
  };
}
