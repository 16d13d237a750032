/**
 * Headers on every answer. The content security policy allows only this origin. A page's scripts run only
 * with the nonce of its own answer ('strict-dynamic' lets those scripts load the app's chunks and the engine
 * worker): Next.js writes its page data as inline <script> tags and puts the nonce it finds in the request's
 * policy on each of them (src/proxy.ts makes a fresh one per page request), so an injected inline script or
 * event handler does not run. This is why every page renders per request (src/app/layout.tsx). API answers
 * (JSON, CSV, calendar feeds) carry no nonce and allow no inline script at all. Styles keep
 * 'unsafe-inline': React and the charts set style attributes, which a nonce cannot cover, and a style cannot
 * run code. The rest: no framing (frame-ancestors 'none'), no plugins, no foreign forms, connections or
 * workers. Referrer-Policy no-referrer everywhere, because share, invitation and reset pages carry a secret
 * in their path.
 */
export function contentSecurityPolicy({ development, nonce }: { development: boolean; nonce?: string }): string {
  // React's development build evaluates code for its debugging overlay; production never does.
  const evalInDev = development ? " 'unsafe-eval'" : "";
  return [
    "default-src 'self'",
    nonce ? `script-src 'self' 'nonce-${nonce}' 'strict-dynamic'${evalInDev}` : `script-src 'self'${evalInDev}`,
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

/** A fresh script nonce: 128 random bits, base64 (the form CSP and Next.js read). */
export function newNonce(): string {
  const bytes = crypto.getRandomValues(new Uint8Array(16));
  return btoa(String.fromCharCode(...bytes));
}

export function securityHeaders({ production, nonce }: { production: boolean; nonce?: string }): Record<string, string> {
  const headers: Record<string, string> = {
    "Content-Security-Policy": contentSecurityPolicy({ development: !production, nonce }),
    "X-Content-Type-Options": "nosniff",
    "Referrer-Policy": "no-referrer",
    "X-Frame-Options": "DENY",
    "Cross-Origin-Opener-Policy": "same-origin",
  };
  // Browsers ignore it over plain http (RFC 6797 §8.1), so the local demo on http://localhost is unaffected.
  if (production) headers["Strict-Transport-Security"] = "max-age=31536000";
  return headers;
}
