/**
 * Generators of invalid or extreme request bodies for the fuzz test: a valid body with one to three of its
 * values (found anywhere in it) replaced by something hostile, keys dropped or unknown keys added; arbitrary JSON;
 * and raw text that is not JSON at all. Deep nesting is spliced into the serialised text, because building a
 * 10,000-level object and stringifying it would test the test runner's stack, not the server.
 */
import fc from "fast-check";

type Json = unknown;
type Path = (string | number)[];

/** Every path inside a value (objects and arrays included), the root excepted. */
export function pathsOf(v: Json, prefix: Path = []): Path[] {
  if (v === null || typeof v !== "object") return [];
  const entries: [string | number, Json][] = Array.isArray(v) ? v.map((x, i) => [i, x]) : Object.entries(v as Record<string, Json>);
  return entries.flatMap(([k, x]) => [[...prefix, k], ...pathsOf(x, [...prefix, k])]);
}

const DEEP = "__fuzz_deep_nesting__";
const deepMarker = fc.integer({ min: 50, max: 12_000 }).map((n) => `${DEEP}${n}`);

/** Values no field should accept silently, and none should crash the server. */
export const hostileValue: fc.Arbitrary<Json> = fc.oneof(
  // wrong types
  fc.constantFrom<Json>(null, true, false, 0, -1, "", [], {}, "0", "true", "null"),
  // huge and odd numbers (JSON has no NaN or Infinity: those arrive as strings or null)
  fc.constantFrom<Json>(1e308, -1e308, Number.MAX_SAFE_INTEGER, -Number.MAX_SAFE_INTEGER, 1e21, 5e-324, -0, 0.1 + 0.2, 2 ** 53 + 2),
  fc.double({ noNaN: true, noDefaultInfinity: true }),
  fc.constantFrom<Json>("NaN", "Infinity", "-Infinity", "1e999", "-0", "0x10", " 12 ", "12abc"),
  // impossible or malformed dates and month-days
  fc.constantFrom<Json>("2027-02-30", "2027-02-29", "2027-13-01", "2027-00-10", "0000-00-00", "2027-2-3", "27-04-05", "2027-04-05T00:00:00Z", "9999-12-31", "02-30", "13-01"),
  // strings with NUL and other control characters, lone surrogates, markup, formulas
  fc.constantFrom<Json>("\u0000", "a\u0000b", "\u0000".repeat(100), "\ud800", "\u202e", "<script>alert(1)</script>", "=HYPERLINK(\"http://x\")", "../../etc/passwd"),
  fc.string({ unit: "binary", maxLength: 40 }),
  // very long strings
  fc.integer({ min: 1_000, max: 200_000 }).map((n) => "x".repeat(n)),
  // huge arrays
  fc.integer({ min: 1_000, max: 20_000 }).chain((n) => fc.constant(Array.from({ length: n }, (_, i) => (i % 2 ? i : { id: `k${i}` })))),
  // deep nesting
  deepMarker,
  // arbitrary JSON in the wrong place
  fc.jsonValue({ maxDepth: 4 }),
);

const unknownKey = fc.oneof(fc.constantFrom("internalNotes", "__proto__", "constructor", "", "a".repeat(5_000)), fc.string({ maxLength: 20 }));

type Mutation = { op: "set"; at: number; value: Json } | { op: "drop"; at: number } | { op: "add"; at: number; key: string; value: Json };

const mutation: fc.Arbitrary<Mutation> = fc.oneof(
  { weight: 6, arbitrary: fc.record({ op: fc.constant("set" as const), at: fc.nat(), value: hostileValue }) },
  { weight: 2, arbitrary: fc.record({ op: fc.constant("drop" as const), at: fc.nat() }) },
  { weight: 2, arbitrary: fc.record({ op: fc.constant("add" as const), at: fc.nat(), key: unknownKey, value: hostileValue }) },
);

/**
 * A fresh copy of a hostile value: fast-check hands out one shared object per constant ({} and [] above), and a
 * later mutation adding a key to it would otherwise change every draw after (or make it its own "__proto__").
 * JSON.parse defines "__proto__" as an own key, as a request body's parser does.
 */
const copyOf = (v: Json): Json => (v === null || typeof v !== "object" ? v : JSON.parse(JSON.stringify(v)));

function applyMutation(root: Record<string, Json>, m: Mutation, paths: Path[]): void {
  const value = "value" in m ? copyOf(m.value) : undefined;
  const path = paths[m.at % paths.length];
  const parentPath = m.op === "add" ? path : path.slice(0, -1);
  let parent: any = root;
  for (const k of parentPath) parent = parent?.[k];
  if (parent === null || typeof parent !== "object") parent = root;
  if (m.op === "add") {
    if (!Array.isArray(parent)) Object.defineProperty(parent, m.key, { value, enumerable: true, writable: true, configurable: true });
    else parent.push(value);
  } else if (m.op === "drop") {
    const key = path.at(-1)!;
    if (Array.isArray(parent)) parent.splice(Number(key), 1);
    else delete parent[key];
  } else {
    parent[path.at(-1)!] = value;
  }
}

/** The serialised request body; deep-nesting markers become that many nested arrays. */
export function serialise(body: Json): string {
  const text = JSON.stringify(body) ?? "null";
  return text.replace(new RegExp(`"${DEEP}(\\d+)"`, "g"), (_, n: string) => "[".repeat(Number(n)) + "]".repeat(Number(n)));
}

export type FuzzBody = { kind: "json"; text: string; note: string } | { kind: "raw"; text: string; note: string };

/** A valid body, mutated; arbitrary JSON; or text that is not JSON. */
export function bodiesFrom(valid: () => Record<string, Json>): fc.Arbitrary<FuzzBody> {
  // The paths of the valid body, found once; a path a previous mutation removed falls back to the root.
  const paths = pathsOf(valid());
  const mutated = fc.array(mutation, { minLength: 1, maxLength: 3 }).map((ms): FuzzBody => {
    const body = valid();
    for (const m of ms) applyMutation(body, m, paths);
    return { kind: "json", text: serialise(body), note: JSON.stringify(ms).slice(0, 400) };
  });
  const arbitrary = fc.jsonValue({ maxDepth: 6 }).map((v): FuzzBody => ({ kind: "json", text: serialise(v), note: "arbitrary JSON" }));
  const wrapped = fc.jsonValue({ maxDepth: 5 }).map((v): FuzzBody => {
    const body = valid();
    const key = Object.keys(body).find((k) => body[k] !== null && typeof body[k] === "object") ?? Object.keys(body)[0];
    body[key] = v;
    return { kind: "json", text: serialise(body), note: `arbitrary JSON as ${key}` };
  });
  const raw = fc.oneof(fc.string({ maxLength: 200 }), fc.constantFrom("", "{", '{"a":', "[1,2", "null", "\u0000", '{"name":"x"}garbage', "\ufeff{}")).map((t): FuzzBody => ({ kind: "raw", text: t, note: "not JSON" }));
  return fc.oneof({ weight: 12, arbitrary: mutated }, { weight: 3, arbitrary: arbitrary }, { weight: 3, arbitrary: wrapped }, { weight: 1, arbitrary: raw });
}

/** Multipart uploads: hostile field values, file names, types and contents (sometimes past the 5 MB limit). */
export interface FuzzUpload {
  fields: Record<string, string>;
  file: { name: string; type: string; size: number; content: string } | null;
  note: string;
}

const hostileText = fc.oneof(
  fc.constantFrom("survey", "weather", "F", "C", "in", "mm", "mph", "kmh", "", "\u0000", "SURVEY", "x".repeat(10_000)),
  fc.string({ maxLength: 30 }),
);
const csvCell = fc.oneof(fc.constantFrom("1200", "12+50", "-1", "1e308", "NaN", "", "\u0000", "=1+1", "2027-02-30", "0.5", "1.5", '"', "x".repeat(5_000)), fc.string({ maxLength: 12 }));
const csvText = fc.oneof(
  fc.tuple(fc.constantFrom("from_station,to_station,repair_share", "date,tmax,tmin,precip,wind", "from_station,to_station", "", "a,b,c", "work_date,shift,operation,station_from_ft,station_to_ft,rain,lost_hours,discovered"), fc.array(fc.array(csvCell, { maxLength: 6 }), { maxLength: 200 })).map(([h, rows]) => [h, ...rows.map((r) => r.join(","))].join("\n")),
  fc.string({ unit: "binary", maxLength: 2_000 }),
  fc.constantFrom("PK\u0003\u0004 not a spreadsheet", "\u0000\u0001\u0002", "\ufeffdate,tmax\n"),
);

export const uploadBodies: fc.Arbitrary<FuzzUpload> = fc
  .record({
    kind: hostileText,
    temperature: hostileText,
    precipitation: hostileText,
    wind: hostileText,
    extra: fc.option(fc.tuple(fc.string({ maxLength: 10 }), hostileText), { nil: undefined }),
    file: fc.option(
      fc.record({
        name: fc.oneof(fc.constantFrom("survey.csv", "data.txt", "sheet.xlsx", "noext", "a\u0000.csv", `${"n".repeat(2_000)}.csv`, "../../x.csv", ".csv"), fc.string({ maxLength: 20 })),
        type: fc.constantFrom("text/csv", "text/plain", "", "application/octet-stream", "application/vnd.ms-excel", "image/png"),
        content: csvText,
        // Rarely a file just past the limit: the answer must be a plain 413, not a crash.
        oversize: fc.oneof({ weight: 150, arbitrary: fc.constant(false) }, { weight: 1, arbitrary: fc.constant(true) }),
      }),
      { nil: null, freq: 8 },
    ),
  })
  .map(({ kind, temperature, precipitation, wind, extra, file }) => {
    const fields: Record<string, string> = { kind, temperature, precipitation, wind };
    if (extra) fields[extra[0]] = extra[1];
    const content = file?.oversize ? "from_station,to_station,repair_share\n" + "1200,1300,0.1\n".repeat(380_000) : (file?.content ?? "");
    return { fields, file: file ? { name: file.name, type: file.type, size: content.length, content } : null, note: JSON.stringify({ fields, file: file && { name: file.name.slice(0, 40), type: file.type, size: content.length } }).slice(0, 400) };
  });
