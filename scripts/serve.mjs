#!/usr/bin/env node
// Serves the built app, like `next start -H $HOST -p $PORT`, plus two things `next start` does not give the
// app: the address of the connected peer, written into the x-pourline-peer header after dropping any copy a
// client sent — the app needs it to know whether a request came through a trusted proxy (TRUSTED_PROXY), the
// only case in which X-Forwarded-For is believed — and the Content-Encoding of a body a route compressed
// itself (below). Binds to 127.0.0.1 unless HOST says otherwise.
import { createServer } from "node:http";
import { dirname, resolve } from "node:path";
import { fileURLToPath } from "node:url";
import next from "next";

const PEER_HEADER = "x-pourline-peer";
// Next drops Content-Encoding from a route handler's answer (the body might be a fetched one it already decoded),
// so a route that sends a body it compressed itself — GET /api/runs/:id, from the run's stored gzip copy — names
// the encoding in this private header, and here it becomes Content-Encoding before the headers go out (which
// also keeps Next's own compression off that body). POURLINE_OWN_ENCODING tells the routes that this server
// does it; under `next dev` they send plain JSON instead. Same name in src/lib/server/stored-run-response.ts.
const OWN_ENCODING_HEADER = "x-pourline-content-encoding";
process.env.POURLINE_OWN_ENCODING = "1";
const root = resolve(dirname(fileURLToPath(import.meta.url)), "..");
const port = Number(process.env.PORT || 3000);
const host = process.env.HOST || "127.0.0.1";

const app = next({ dev: false, dir: root, hostname: host, port });
const handle = app.getRequestHandler();
await app.prepare();

const server = createServer((req, res) => {
  req.headers[PEER_HEADER] = req.socket.remoteAddress ?? "";
  const setHeader = res.setHeader.bind(res);
  res.setHeader = (name, value) => setHeader(String(name).toLowerCase() === OWN_ENCODING_HEADER ? "Content-Encoding" : name, value);
  handle(req, res).catch((e) => {
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
