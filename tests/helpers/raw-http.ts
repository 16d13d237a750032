/** A request to the test app over node:http, so a test sees the status, headers and bytes exactly as sent (no decoding). */
import { request } from "node:http";
import { APP_URL } from "./app";

export interface RawReply {
  status: number;
  headers: Record<string, string | string[] | undefined>;
  body: Buffer;
}

export function raw(path: string, headers: Record<string, string>, method: "GET" | "HEAD" = "GET"): Promise<RawReply> {
  return new Promise((resolve, reject) => {
    const req = request(`${APP_URL}${path}`, { method, headers }, (res) => {
      const chunks: Buffer[] = [];
      res.on("data", (c: Buffer) => chunks.push(c));
      res.on("end", () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(chunks) }));
      res.on("error", reject);
    });
    req.on("error", reject);
    req.end();
  });
}
