/**
 * The stored copy of a run's results and the gzip body built around it (db/stored-results.ts,
 * src/lib/server/gzip-splice.ts), and the validator helpers of src/lib/server/http-cache.ts. Decoding is done by
 * Node's own gunzip, which checks the trailer's CRC-32 and length, so a wrong splice or CRC fails here.
 */
import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { constants, crc32, gunzipSync, inflateRawSync } from "node:zlib";
import { storedResultsOf } from "@db/stored-results";
import { crc32Combine, gzipAround } from "@/lib/server/gzip-splice";
import { acceptsGzip, noneMatchHits } from "@/lib/server/http-cache";

const bytes = (max: number) => fc.uint8Array({ maxLength: max }).map((a) => Buffer.from(a));
const middleOf = (value: unknown) => {
  const s = storedResultsOf(value);
  return { deflate: s.resultsDeflate, crc32: s.resultsCrc32, length: s.resultsLength };
};

describe("crc32Combine", () => {
  it("gives the CRC-32 of two pieces joined, from each piece's CRC and the second's length", () => {
    fc.assert(
      fc.property(bytes(3000), bytes(3000), (a, b) => {
        expect(crc32Combine(crc32(a), crc32(b), b.length)).toBe(crc32(Buffer.concat([a, b])));
      }),
    );
  });
  it("holds for a second piece far longer than the first (lengths with many bits set)", () => {
    const a = Buffer.from("{\"run\":");
    const b = Buffer.alloc(262_143, 0x5a);
    expect(crc32Combine(crc32(a), crc32(b), b.length)).toBe(crc32(Buffer.concat([a, b])));
  });
});

describe("storedResultsOf", () => {
  const results = { finish: { p50: "2028-06-01" }, cdf: Array.from({ length: 500 }, (_, i) => ({ day: i, p: i / 500 })), unfinished: Infinity };
  it("keeps the JSON a reader would get from the results column, deflated and left open for more", () => {
    const s = storedResultsOf(results);
    const json = Buffer.from(JSON.stringify(results));
    expect(inflateRawSync(s.resultsDeflate, { finishFlush: constants.Z_SYNC_FLUSH }).equals(json)).toBe(true);
    expect(s.resultsLength).toBe(json.length);
    expect(s.resultsCrc32).toBe(crc32(json));
    // A sync flush ends on an empty stored block (00 00 ff ff): byte-aligned, and not the final block.
    expect([...s.resultsDeflate.subarray(-4)]).toEqual([0, 0, 0xff, 0xff]);
    expect(s.resultsDeflate.length).toBeLessThan(json.length / 3);
  });
  it("tags the content: the same results the same tag, other results another", () => {
    expect(storedResultsOf(results).resultsEtag).toBe(storedResultsOf(structuredClone(results)).resultsEtag);
    expect(storedResultsOf({ ...results, finish: { p50: "2028-06-02" } }).resultsEtag).not.toBe(storedResultsOf(results).resultsEtag);
  });
});

describe("gzipAround", () => {
  it("makes one gzip stream that inflates to before + stored middle + after", () => {
    fc.assert(
      fc.property(bytes(2000), fc.jsonValue(), bytes(2000), (before, value, after) => {
        const json = Buffer.from(JSON.stringify(value) ?? "null");
        const middle = middleOf(value ?? null);
        const out = gunzipSync(Buffer.concat(gzipAround(before, middle, after)));
        expect(out.equals(Buffer.concat([before, json, after]))).toBe(true);
      }),
      { numRuns: 200 },
    );
  });
  it("splits a part longer than one stored block (65,535 bytes), only the very last block final, and allows an empty part", () => {
    const long = Buffer.alloc(140_000, 0x61);
    const middle = middleOf({ a: [1, 2, 3] });
    const json = Buffer.from('{"a":[1,2,3]}');
    expect(gunzipSync(Buffer.concat(gzipAround(long, middle, Buffer.alloc(0)))).equals(Buffer.concat([long, json]))).toBe(true);
    expect(gunzipSync(Buffer.concat(gzipAround(Buffer.alloc(0), middle, long))).equals(Buffer.concat([json, long]))).toBe(true);
  });
  it("builds JSON that parses to the fields and the stored results", () => {
    const results = { histogram: [3, 1, 4, 1, 5], name: "Kestrel Bay — two seasons" };
    const out = gunzipSync(Buffer.concat(gzipAround(Buffer.from('{"run":{"id":"x","stale":true,"results":'), middleOf(results), Buffer.from("}}"))));
    expect(JSON.parse(out.toString("utf8"))).toEqual({ run: { id: "x", stale: true, results } });
  });
});

describe("acceptsGzip", () => {
  it.each([
    ["gzip, deflate, br, zstd", true],
    ["GZIP", true],
    ["x-gzip", true],
    ["br;q=1.0, gzip;q=0.8", true],
    ["*", true],
    ["br, *;q=0.1", true],
    ["gzip;q=0", false],
    ["*, gzip;q=0", false],
    ["*;q=0", false],
    ["identity", false],
    ["br", false],
    ["", false],
  ])("%j → %s", (header, want) => {
    expect(acceptsGzip(header)).toBe(want);
  });
  it("no header → identity", () => expect(acceptsGzip(null)).toBe(false));
});

describe("noneMatchHits", () => {
  const tag = '"abc.def-gz"';
  it.each([
    ['"abc.def-gz"', true],
    ['W/"abc.def-gz"', true],
    ['"zzz", "abc.def-gz"', true],
    ["*", true],
    ['"abc.def"', false],
    ['"ABC.DEF-GZ"', false],
    ["", false],
  ])("%j → %s", (header, want) => {
    expect(noneMatchHits(header, tag)).toBe(want);
  });
  it("compares weakly: a weak current tag matches its strong form", () => expect(noneMatchHits('"x"', 'W/"x"')).toBe(true));
  it("no header → no match", () => expect(noneMatchHits(null, tag)).toBe(false));
});
