/**
 * Headers on every answer. The content security policy allows only this origin; Next.js writes its page
 * data as inline <script> tags, so scripts need 'unsafe-inline' ('self' alone blocks hydration) — a nonce
 * would force every page to render per request. The policy's real work is elsewhere: no framing
 * (frame-ancestors 'none'), no plugins, no foreign forms, connections or workers. Referrer-Policy
 * no-referrer everywhere, because share, invitation and reset pages carry a secret in their path.
 */
export function contentSecurityPolicy({ development }: { development: boolean }): string {
  return [
    "default-src 'self'",
    // React's development build evaluates code for its debugging overlay; production never does.
    `script-src 'self' 'unsafe-inline'${development ? " 'unsafe-eval'" : ""}`,
    "style-src 'self' 'unsafe-inline'",
    "img-src 'self' data: blob:",
    "font-src 'self'",
    `connect-src 'self'${development ? " ws: wss:" : ""}`,
    "worker-src 'self' blob:",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
  ].join("; ");
}

export function securityHeaders({ production }: { production: boolean }): Record<string, string> {
  const headers: Record<string, string> = {
    "Content-Security-Policy": contentSecurityPolicy({ development: !production }),
    "X-Content-Type-Options": "nosniff",
    "Referrer-Policy": "no-referrer",
    "X-Frame-Options": "DENY",
    "Cross-Origin-Opener-Policy": "same-origin",
  };
  // Browsers ignore it over plain http (RFC 6797 §8.1), so the local demo on http://localhost is unaffected.
  if (production) headers["Strict-Transport-Security"] = "max-age=31536000";
  return headers;
}
