/**
 * Which requests scripts/serve.mjs answers itself (src/lib/server/fast-reads.ts): a GET of exactly the scenario
 * list or a run. Everything else must reach Next — another method (HEAD included), a trailing slash Next would
 * redirect, an escaped id Next would decode, a longer path — and is recognised as such before any session or
 * database is touched (this test has neither).
 */
import { describe, expect, it } from "vitest";
import type { IncomingMessage, ServerResponse } from "node:http";
import { answerFastRead } from "@/lib/server/fast-reads";

const ID = "3f2c1a7e-5b9d-4c1e-8a6f-0d2b4e6c8a10";

function untouchedResponse(): ServerResponse {
  const fail = () => {
    throw new Error("a request left to Next was answered");
  };
  return { writeHead: fail, end: fail, setHeader: fail } as unknown as ServerResponse;
}

const ask = (method: string, url: string) => answerFastRead({ method, url, headers: {} } as IncomingMessage, untouchedResponse());

describe("the reads served before Next", () => {
  it.each([
    ["HEAD", `/api/runs/${ID}`],
    ["POST", `/api/projects/${ID}/scenarios`],
    ["DELETE", `/api/runs/${ID}`],
    ["GET", `/api/runs/${ID}/`],
    ["GET", `/api/runs/%33${ID.slice(1)}`],
    ["GET", `/api/runs/${ID}/verify`],
    ["GET", "/api/runs"],
    ["GET", `/api/projects/${ID}/scenarios/`],
    ["GET", `/api/projects/${ID}/scenarios/${ID}`],
    ["GET", `/api/projects/${ID}`],
    ["GET", `//api/runs/${ID}`],
    ["GET", `/api/runs/${"a".repeat(65)}`],
    ["GET", "/"],
  ])("leaves %s %s to Next", async (method, url) => {
    expect(await ask(method, url)).toBe(false);
  });
});

describe("an answer served before Next", () => {
  it.each([`/api/runs/${ID}`, `/api/projects/${ID}/scenarios?fresh=1`])("GET %s without a session is 401 with the security headers", async (url) => {
    const sent: { status?: number; headers?: Record<string, unknown>; body?: Buffer } = {};
    const res = {
      writeHead: (status: number, headers: Record<string, unknown>) => Object.assign(sent, { status, headers }),
      end: (body: Buffer) => Object.assign(sent, { body }),
    } as unknown as ServerResponse;
    expect(await answerFastRead({ method: "GET", url, headers: {} } as IncomingMessage, res)).toBe(true);
    expect(sent.status).toBe(401);
    expect(JSON.parse(sent.body!.toString("utf8"))).toMatchObject({ code: "unauthorized", error: "Sign in to continue." });
    expect(sent.headers).toMatchObject({ "content-type": "application/json", "X-Frame-Options": "DENY", "X-Content-Type-Options": "nosniff", "Referrer-Policy": "no-referrer" });
    expect(String(sent.headers!["Content-Security-Policy"])).toContain("frame-ancestors 'none'");
    expect(sent.headers!["content-length"]).toBe(String(sent.body!.length));
  });
});
