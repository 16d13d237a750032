import { NextResponse, type NextRequest } from "next/server";
import { SAFE_METHODS, ownOrigins, sameOrigin } from "@/lib/http/origin";
import { newNonce, securityHeaders } from "@/lib/http/security-headers";
import { fromTrustedProxy } from "@/lib/http/trusted-proxy";

/**
 * Runs before every page, API route and server action: refuses a state-changing request whose Origin is not
 * the app's own (a plain 403 JSON answer, also for server actions, which Next itself would answer with a
 * 500), and puts the security headers on every answer. A page request gets a fresh script nonce: in the
 * request's own policy header, where Next.js reads it to mark its scripts, and in the answer's policy
 * (src/lib/http/security-headers.ts). API answers carry the policy without one, as the fast reads do.
 */
export function proxy(request: NextRequest) {
  const production = process.env.NODE_ENV === "production";
  const allowed = SAFE_METHODS.has(request.method) || sameOrigin(request.headers.get("origin"), allowedOrigins(request));
  const nonce = allowed && !request.nextUrl.pathname.startsWith("/api/") ? newNonce() : undefined;
  const headers = securityHeaders({ production, nonce });
  let response: NextResponse;
  if (!allowed) response = refuse();
  else if (nonce) {
    const forwarded = new Headers(request.headers);
    forwarded.set("content-security-policy", headers["Content-Security-Policy"]);
    response = NextResponse.next({ request: { headers: forwarded } });
  } else response = NextResponse.next();
  for (const [name, value] of Object.entries(headers)) response.headers.set(name, value);
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
