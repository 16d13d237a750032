import { NextResponse, type NextRequest } from "next/server";
import { SAFE_METHODS, ownOrigins, sameOrigin } from "@/lib/http/origin";
import { securityHeaders } from "@/lib/http/security-headers";
import { fromTrustedProxy } from "@/lib/http/trusted-proxy";

/**
 * Runs before every page, API route and server action: refuses a state-changing request whose Origin is not
 * the app's own (a plain 403 JSON answer, also for server actions, which Next itself would answer with a
 * 500), and puts the security headers on every answer.
 */
export function proxy(request: NextRequest) {
  const response = SAFE_METHODS.has(request.method) || sameOrigin(request.headers.get("origin"), allowedOrigins(request)) ? NextResponse.next() : refuse();
  for (const [name, value] of Object.entries(securityHeaders({ production: process.env.NODE_ENV === "production" }))) response.headers.set(name, value);
  return response;
}

function allowedOrigins(request: NextRequest): string[] {
  const trusted = fromTrustedProxy(request.headers);
  const host = (trusted && request.headers.get("x-forwarded-host")) || request.headers.get("host");
  // The server itself speaks only plain HTTP (TLS ends at the proxy), so without a trusted proxy it is "http".
  const scheme = (trusted && request.headers.get("x-forwarded-proto")?.split(",")[0].trim()) || "http";
  return ownOrigins({ appBaseUrl: process.env.APP_BASE_URL, extra: process.env.POURLINE_ALLOWED_ORIGINS, scheme, host });
}

function refuse() {
  return NextResponse.json({ error: "This request did not come from Pourline itself.", code: "forbidden", fields: [] }, { status: 403 });
}

// Everything but the build's static files (which carry no secrets and change no state).
export const config = { matcher: ["/((?!_next/static|_next/image|favicon.ico).*)"] };
