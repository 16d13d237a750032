import "server-only";
import { createHash, randomBytes } from "node:crypto";

/** 32 random bytes (256 bits) as base64url; stored only as its SHA-256. */
export function newShareToken() {
  const token = randomBytes(32).toString("base64url");
  return { token, tokenHash: hashShareToken(token) };
}

export function hashShareToken(token: string) {
  return createHash("sha256").update(token).digest("hex");
}
