import { NextResponse, type NextRequest } from "next/server";

/**
 * Cross-site request check for state-changing API calls: the Origin must be this site's own. Server actions
 * carry the framework's own origin check; route handlers get this one. Reads need no check.
 */
export function proxy(request: NextRequest) {
  if (request.method === "GET" || request.method === "HEAD" || request.method === "OPTIONS") return NextResponse.next();
  const origin = request.headers.get("origin");
  const host = request.headers.get("x-forwarded-host") ?? request.headers.get("host");
  if (!origin || !host) return refuse();
  try {
    if (new URL(origin).host !== host) return refuse();
  } catch {
    return refuse();
  }
  return NextResponse.next();
}

function refuse() {
  return NextResponse.json({ error: "This request did not come from Pourline itself.", code: "forbidden", fields: [] }, { status: 403 });
}

export const config = { matcher: "/api/:path*" };
