import "server-only";
/**
 * The two reads every open page repeats — GET /api/projects/:projectId/scenarios and GET /api/runs/:runId —
 * answered by scripts/serve.mjs before Next.js sees the request. Next's request pipeline costs this machine
 * 8–9 ms of CPU per request even for an answer that does nothing (measured; README "Measured"), several times
 * the read itself, and under a team's load that was most of the latency. The answer is the one the route
 * handlers give: the same session check (checkSessionToken, cookie renewal included), the same access checks
 * and bodies (read-answers.ts), the same errors (errorResponse) and the same security headers src/proxy.ts
 * puts on every answer. Anything else — another method or path, a path Next would first normalise (a trailing
 * slash, escapes) — is left to Next. Built into its own bundle at build time (scripts/build-fast-reads.mjs);
 * POURLINE_FAST_READS=off leaves these two to Next as well.
 */
import type { IncomingMessage, ServerResponse } from "node:http";
import { securityHeaders } from "@/lib/http/security-headers";
import { errorResponse } from "./errors";
import { requireSignedIn } from "./access";
import type { PlainAnswer, ReadRequest } from "./http-cache";
import { runAnswer, scenarioListAnswer } from "./read-answers";
import { checkSessionToken, lucia } from "./session-token";

// Only the characters of an id: anything escaped or odd goes to Next, which decodes and refuses it as before.
const ID = "([0-9A-Za-z-]{1,64})";
const RUN = new RegExp(`^/api/runs/${ID}$`);
const SCENARIO_LIST = new RegExp(`^/api/projects/${ID}/scenarios$`);

/** The private header names of a body an answer compressed itself (http-cache.ts) and their real names. */
const OWN_HEADERS: Record<string, string> = { "x-pourline-content-encoding": "content-encoding", "x-pourline-content-length": "content-length" };

type Answer = typeof runAnswer;

/** Answers `req` when it is one of the two reads, and says whether it did. */
export async function answerFastRead(req: IncomingMessage, res: ServerResponse): Promise<boolean> {
  if (req.method !== "GET" || !req.url) return false;
  const query = req.url.indexOf("?");
  const path = query < 0 ? req.url : req.url.slice(0, query);
  let match = RUN.exec(path);
  const answer: Answer | null = match ? runAnswer : (match = SCENARIO_LIST.exec(path)) ? scenarioListAnswer : null;
  if (!answer || !match) return false;

  // The answers read only these two headers (validators and encoding); Node gives each as one string.
  const headers = { "accept-encoding": req.headers["accept-encoding"], "if-none-match": req.headers["if-none-match"] };
  const request: ReadRequest = { headers: { get: (name) => headers[name as keyof typeof headers] ?? null } };
  let setCookie: string | null = null;
  let out: PlainAnswer;
  try {
    const token = req.headers.cookie ? lucia().readSessionCookie(req.headers.cookie) : null;
    const session = token ? await checkSessionToken(token) : { signedIn: null, cookie: null };
    setCookie = session.cookie?.serialize() ?? null;
    out = await answer(request, match[1], requireSignedIn(session.signedIn));
  } catch (e) {
    // Refusals (401/404/403) and failures (500 with a reference in the log) as every route answers them.
    const failed = errorResponse(e);
    out = { status: failed.status, headers: Object.fromEntries(failed.headers), body: Buffer.from(await failed.arrayBuffer()) };
  }
  writeAnswer(res, out, setCookie);
  return true;
}

const SECURITY_HEADERS = Object.entries(securityHeaders({ production: process.env.NODE_ENV === "production" }));

function writeAnswer(res: ServerResponse, answer: PlainAnswer, setCookie: string | null) {
  const headers: Record<string, string | string[]> = {};
  for (const name in answer.headers) headers[OWN_HEADERS[name] ?? name] = answer.headers[name];
  for (const [name, value] of SECURITY_HEADERS) headers[name] = value;
  if (setCookie) headers["set-cookie"] = [setCookie];
  const { body } = answer;
  if (body && !headers["content-length"]) headers["content-length"] = String(body.length);
  res.writeHead(answer.status, headers);
  res.end(body);
}
