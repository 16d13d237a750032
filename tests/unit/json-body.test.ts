/** Reading JSON bodies: size (declared and counted), depth, unsafe characters, strict parsing and capped error lists. */
import { describe, expect, it } from "vitest";
import { z } from "zod";
import { AppError, badRequest, readJson } from "../../src/lib/server/errors";
import { jsonDepthExceeds, MAX_JSON_BYTES, unsafeStrings } from "../../src/lib/server/json-body";

const schema = z.object({ name: z.string().max(50) }).strict();

function request(body: BodyInit, headers: Record<string, string> = {}) {
  return new Request("http://app.test/api/x", { method: "POST", body, headers: { "content-type": "application/json", ...headers }, duplex: "half" } as RequestInit);
}

/** A stream that sends `total` bytes in 64 kB chunks and counts how many were pulled. */
function streamOf(total: number) {
  let sent = 0;
  const stream = new ReadableStream<Uint8Array>({
    pull(c) {
      if (sent >= total) return c.close();
      const n = Math.min(65_536, total - sent);
      sent += n;
      c.enqueue(new Uint8Array(n).fill(32));
    },
  });
  return { stream, sent: () => sent };
}

async function refusal(p: Promise<unknown>): Promise<{ status: number; body: any }> {
  try {
    await p;
  } catch (e) {
    if (!(e instanceof AppError)) throw e;
    const res = e.toResponse();
    return { status: res.status, body: await res.json() };
  }
  throw new Error("expected a refusal");
}

describe("jsonDepthExceeds", () => {
  it("counts nesting of arrays and objects, not brackets inside strings", () => {
    expect(jsonDepthExceeds('{"a":[{"b":1}]}', 3)).toBe(false);
    expect(jsonDepthExceeds('{"a":[{"b":[1]}]}', 3)).toBe(true);
    expect(jsonDepthExceeds('{"a":"[[[[[[\\"[[[["}', 1)).toBe(false);
    expect(jsonDepthExceeds("[".repeat(10_000) + "]".repeat(10_000), 32)).toBe(true);
  });
});

describe("unsafeStrings", () => {
  it("finds NUL and control characters in values and keys, with paths, but allows tab and new lines", () => {
    expect(unsafeStrings({ a: "ok\tfine\r\n", list: ["x", "y\u0000"], deep: { k: "\u001b[31m" } })).toEqual([
      { path: "list[1]", message: "must not contain the NUL character (U+0000)" },
      { path: "deep.k", message: "must not contain control characters (found U+001B)" },
    ]);
    expect(unsafeStrings({ "bad\u0000key": 1 })[0].message).toMatch(/^field name must not contain the NUL/);
    expect(unsafeStrings("\ud800")[0]).toEqual({ path: "(body)", message: "must not contain a broken character (a lone UTF-16 surrogate)" });
    expect(unsafeStrings({ emoji: "🙂" })).toEqual([]);
  });

  it("does not recurse (a value nested 100,000 deep is walked without overflowing the stack)", () => {
    let v: unknown = "\u0000";
    for (let i = 0; i < 100_000; i++) v = [v];
    expect(unsafeStrings(v)).toHaveLength(1);
  });
});

describe("readJson", () => {
  it("parses a good body", async () => {
    expect(await readJson(request(JSON.stringify({ name: "Deck" })), schema)).toEqual({ name: "Deck" });
  });

  it("answers 413 from Content-Length before reading, with a plain message", async () => {
    const r = await refusal(readJson(request("{}", { "content-length": String(MAX_JSON_BYTES + 1) }), schema));
    expect(r.status).toBe(413);
    expect(r.body).toMatchObject({ code: "too_large", error: "The request is larger than 1 MB; nothing was saved.", fields: [{ path: "(body)", label: "Request body", message: "must be at most 1 MB" }] });
  });

  it("answers 413 when a body without a (true) Content-Length grows past the limit, and stops reading", async () => {
    const big = streamOf(50 * 1024 * 1024);
    const r = await refusal(readJson(request(big.stream), schema));
    expect(r.status).toBe(413);
    expect(big.sent()).toBeLessThan(MAX_JSON_BYTES + 3 * 65_536);
    const lying = streamOf(2 * MAX_JSON_BYTES);
    expect((await refusal(readJson(request(lying.stream, { "content-length": "10" }), schema))).status).toBe(413);
  });

  it("a route may allow a larger body", async () => {
    const text = JSON.stringify({ name: "x", pad: " ".repeat(MAX_JSON_BYTES) });
    expect((await refusal(readJson(request(text), z.object({ name: z.string(), pad: z.string() })))).status).toBe(413);
    expect(await readJson(request(text), z.object({ name: z.string(), pad: z.string() }), { maxBytes: 2 * MAX_JSON_BYTES })).toMatchObject({ name: "x" });
  });

  it("refuses 10,000-level nesting, NUL characters and invalid JSON with 400 naming the field", async () => {
    const deep = await refusal(readJson(request("[".repeat(10_000) + "]".repeat(10_000)), schema));
    expect(deep).toMatchObject({ status: 400, body: { fields: [{ path: "(body)", message: "must not nest more than 32 levels" }] } });
    const nul = await refusal(readJson(request(JSON.stringify({ name: "A\u0000B" })), schema));
    expect(nul).toMatchObject({ status: 400, body: { fields: [{ path: "name", label: "Name", message: "must not contain the NUL character (U+0000)" }] } });
    const bad = await refusal(readJson(request("{nope"), schema));
    expect(bad).toMatchObject({ status: 400, body: { error: "The request body is not valid JSON." } });
    const notUtf8 = await refusal(readJson(request(new Uint8Array([0x7b, 0xff, 0x7d])), schema));
    expect(notUtf8.body.fields[0].message).toBe("must be UTF-8 text");
  });

  it("names each unknown field of a strict schema", async () => {
    const r = await refusal(readJson(request(JSON.stringify({ name: "x", internalNotes: "y" })), schema));
    expect(r.body.fields).toEqual([{ path: "internalNotes", label: "Internal notes", message: "is not a known field (unknown fields are refused)" }]);
  });
});

describe("error lists", () => {
  it("list the first 100 problems and count the rest", async () => {
    const problems = Array.from({ length: 200_000 }, (_, i) => ({ path: `calendar.holidays.blackoutDates[${i}]`, message: "must be a date YYYY-MM-DD" }));
    const res = badRequest(problems, "The scenario has problems; nothing was saved.").toResponse();
    const body = await res.json();
    expect(res.status).toBe(400);
    expect(body.fields).toHaveLength(100);
    expect(body.fields[99]).toEqual({ path: "calendar.holidays.blackoutDates[99]", label: "Calendar › Holidays › Blackout date 100", message: "must be a date YYYY-MM-DD" });
    expect(body.moreProblems).toBe(199_900);
    expect(body.error).toBe("The scenario has problems; nothing was saved. The first 100 problems are listed (and 199,900 more problems).");
    expect(JSON.stringify(body).length).toBeLessThan(20_000);
  });

  it("a short list is given whole, without a count", async () => {
    const body = await badRequest([{ path: "name", message: "must not be empty" }]).toResponse().json();
    expect(body).toEqual({ error: "Some fields need attention.", code: "bad_request", fields: [{ path: "name", label: "Name", message: "must not be empty" }] });
  });
});
