#!/usr/bin/env node
// Serves the built app, like `next start -H $HOST -p $PORT`, plus three things `next start` does not give the
// app: the two reads every open page repeats, answered without Next's per-request cost (below); the address of
// the connected peer, written into the x-pourline-peer header after dropping any copy a client sent — the app
// needs it to know whether a request came through a trusted proxy (TRUSTED_PROXY), the only case in which
// X-Forwarded-For is believed — and the Content-Encoding of a body a route compressed itself (below). Binds to
// 127.0.0.1 unless HOST says otherwise.
import { createServer } from "node:http";
import { dirname, join, resolve } from "node:path";
import { fileURLToPath, pathToFileURL } from "node:url";
import next from "next";

const PEER_HEADER = "x-pourline-peer";
// Next drops Content-Encoding and Content-Length from a route handler's answer (the body might be a fetched one
// it already decoded), so a route that sends a body it compressed itself — GET /api/runs/:id from the run's
// stored gzip copy, and the JSON lists that gzip their small answer in one call (src/lib/server/http-cache.ts)
// — names the encoding and the length in these private headers, and here they become the real ones before the
// headers go out (the encoding also keeps Next's own compression off that body; the length spares the chunked
// framing and the separate write that ends it). POURLINE_OWN_ENCODING tells the routes that this server does
// it; under `next dev` they send plain JSON instead. Same names in src/lib/server/http-cache.ts.
const OWN_HEADERS = new Map([
  ["x-pourline-content-encoding", "Content-Encoding"],
  ["x-pourline-content-length", "Content-Length"],
]);
process.env.POURLINE_OWN_ENCODING = "1";
const root = resolve(dirname(fileURLToPath(import.meta.url)), "..");
const port = Number(process.env.PORT || 3000);
const host = process.env.HOST || "127.0.0.1";

// Every moment on a page or in an e-mail is shown in this zone (src/lib/format.ts `displayTimeZone`): refuse to
// start on a name the runtime does not know rather than fail on every page.
if (process.env.POURLINE_TIME_ZONE) {
  try {
    new Intl.DateTimeFormat("en-US", { timeZone: process.env.POURLINE_TIME_ZONE });
  } catch {
    console.error(`[pourline] POURLINE_TIME_ZONE="${process.env.POURLINE_TIME_ZONE}" is not a time zone this Node knows; use an IANA name such as America/Chicago.`);
    process.exit(1);
  }
}

const app = next({ dev: false, dir: root, hostname: host, port });
const handle = app.getRequestHandler();
await app.prepare();

// The scenario list and a run's results are answered before Next (src/lib/server/fast-reads.ts, bundled by
// scripts/build-fast-reads.mjs): the same code and checks as their route handlers, without the framework's
// per-request cost. POURLINE_FAST_READS=off leaves them to Next.
const answerFastRead =
  process.env.POURLINE_FAST_READS === "off"
    ? null
    : (await import(pathToFileURL(join(root, process.env.POURLINE_DIST_DIR ?? ".next", "pourline-fast-reads.mjs")).href)).answerFastRead;

/**
 * Next sends an answer's headers on their own (flushHeaders) just before the first chunk of its body, then the
 * body, then — for a body of unknown length — the end of the chunked encoding: three socket writes for an
 * answer that is whole in memory, and on this kind of machine each write to a socket costs far more than
 * the bytes (the peer is woken). Holding the socket corked until the end of this turn of the event loop sends
 * them as one write; an answer that streams still leaves with its first chunk, only that much later.
 */
function holdHeadersForBody(res) {
  const flushHeaders = res.flushHeaders.bind(res);
  res.flushHeaders = () => {
    const socket = res.socket;
    if (socket && !socket.writableCorked) {
      socket.cork();
      setImmediate(() => socket.uncork());
    }
    flushHeaders();
  };
}

const server = createServer((req, res) => {
  req.headers[PEER_HEADER] = req.socket.remoteAddress ?? "";
  const setHeader = res.setHeader.bind(res);
  res.setHeader = (name, value) => setHeader(OWN_HEADERS.get(String(name).toLowerCase()) ?? name, value);
  holdHeadersForBody(res);
  const answered = answerFastRead ? answerFastRead(req, res) : Promise.resolve(false);
  answered
    .then((done) => (done ? undefined : handle(req, res)))
    .catch((e) => {
      console.error(`[pourline] request failed: ${e?.name ?? "Error"}`);
      if (!res.headersSent) res.writeHead(500).end();
    });
});
// Longer than a proxy's or an HTTP client's idle keep-alive, so the server is never the side closing a
// connection the other end is about to reuse (a reset request) — Node's own default is 5 s.
server.keepAliveTimeout = 65_000;
server.headersTimeout = 66_000;
// A port taken between choosing it and listening (test runs sharing a machine): say so and stop, so whoever
// started this server tries another port instead of talking to someone else's app.
server.on("error", (e) => {
  console.error(`[pourline] cannot listen on ${host}:${port}: ${e.code ?? e.message}`);
  process.exit(1);
});
server.listen(port, host, () => console.log(`[pourline] serving on http://${host.includes(":") ? `[${host}]` : host}:${port}`));

for (const sig of ["SIGINT", "SIGTERM"]) {
  process.on(sig, () => {
    server.close(() => process.exit(0));
    setTimeout(() => process.exit(0), 3_000).unref();
  });
}
