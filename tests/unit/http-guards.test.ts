/**
 * The request guards that need no server: which address a request is counted under (forwarded headers only
 * from a trusted proxy), the full-origin comparison, the security headers and the mail catcher's switch.
 */
import { describe, expect, it } from "vitest";
import { clientAddress, parseTrustedProxies, PEER_HEADER } from "../../src/lib/http/trusted-proxy";
import { ownOrigins, sameOrigin } from "../../src/lib/http/origin";
import { contentSecurityPolicy, newNonce, securityHeaders } from "../../src/lib/http/security-headers";
import { mailCatcherPageEnabled } from "../../src/lib/server/mailbox";

const req = (peer: string | null, xff?: string) => {
  const h = new Headers();
  if (peer !== null) h.set(PEER_HEADER, peer);
  if (xff) h.set("x-forwarded-for", xff);
  return h;
};

describe("clientAddress", () => {
  const proxies = parseTrustedProxies("10.0.0.5, 192.168.1.0/24");

  it("ignores X-Forwarded-For from a peer that is not a trusted proxy", () => {
    expect(clientAddress(req("203.0.113.9", "198.51.100.1"), proxies)).toBe("203.0.113.9");
    expect(clientAddress(req("::ffff:203.0.113.9", "198.51.100.1"), proxies)).toBe("203.0.113.9");
  });

  it("takes the right-most untrusted entry behind trusted proxies, not what the client wrote on the left", () => {
    expect(clientAddress(req("10.0.0.5", "6.6.6.6, 198.51.100.1"), proxies)).toBe("198.51.100.1");
    expect(clientAddress(req("10.0.0.5", "6.6.6.6, 198.51.100.1, 192.168.1.20"), proxies)).toBe("198.51.100.1");
  });

  it("falls back to the peer, and to 'unknown' without the server's peer header", () => {
    expect(clientAddress(req("10.0.0.5"), proxies)).toBe("10.0.0.5");
    expect(clientAddress(req(null, "198.51.100.1"), proxies)).toBe("unknown");
  });

  it("refuses a setting that is not an address", () => {
    expect(() => parseTrustedProxies("proxy.internal")).toThrow(/TRUSTED_PROXY/);
  });
});

describe("origin check", () => {
  const own = ownOrigins({ appBaseUrl: "http://localhost:3000", scheme: "http", host: "ignored:1" });

  it("compares scheme, host and port", () => {
    expect(sameOrigin("http://localhost:3000", own)).toBe(true);
    expect(sameOrigin("https://localhost:3000", own)).toBe(false);
    expect(sameOrigin("http://localhost:3001", own)).toBe(false);
    expect(sameOrigin("http://localhost:3000.evil.example", own)).toBe(false);
    expect(sameOrigin("null", own)).toBe(false);
    expect(sameOrigin(null, own)).toBe(false);
  });

  it("without APP_BASE_URL uses the host the request reached, with the scheme the server sees", () => {
    const seen = ownOrigins({ scheme: "http", host: "pourline.internal:8080" });
    expect(seen).toEqual(["http://pourline.internal:8080"]);
    expect(sameOrigin("https://pourline.internal:8080", seen)).toBe(false);
    expect(ownOrigins({ appBaseUrl: "https://plan.example/", extra: "http://127.0.0.1:3000", scheme: "http", host: "x" })).toEqual(["https://plan.example", "http://127.0.0.1:3000"]);
  });
});

describe("security headers", () => {
  it("a page's policy runs only scripts with its nonce; other answers allow no inline script; nothing allows eval in production", () => {
    const nonce = newNonce();
    const page = contentSecurityPolicy({ development: false, nonce });
    const scriptSrc = (p: string) => p.split("; ").find((d) => d.startsWith("script-src "));
    expect(scriptSrc(page)).toBe(`script-src 'self' 'nonce-${nonce}' 'strict-dynamic'`);
    expect(scriptSrc(contentSecurityPolicy({ development: false }))).toBe("script-src 'self'");
    expect(page).not.toContain("unsafe-eval");
    expect(scriptSrc(contentSecurityPolicy({ development: true, nonce }))).toContain("'unsafe-eval'");
    expect(securityHeaders({ production: true, nonce })["Content-Security-Policy"]).toBe(page);
  });

  it("a nonce is 128 random bits in base64, fresh each time", () => {
    const seen = new Set(Array.from({ length: 200 }, () => newNonce()));
    expect(seen.size).toBe(200);
    for (const n of seen) {
      expect(n).toMatch(/^[A-Za-z0-9+/]{22}==$/);
      expect(Buffer.from(n, "base64")).toHaveLength(16);
    }
  });

  it("forbid framing and sniffing, send no referrer, and add HSTS in production only", () => {
    const prod = securityHeaders({ production: true });
    expect(prod["Content-Security-Policy"]).toContain("frame-ancestors 'none'");
    expect(prod["Content-Security-Policy"]).toContain("object-src 'none'");
    expect(prod["Content-Security-Policy"]).not.toContain("unsafe-eval");
    expect(prod["X-Content-Type-Options"]).toBe("nosniff");
    expect(prod["Referrer-Policy"]).toBe("no-referrer");
    expect(prod["Strict-Transport-Security"]).toMatch(/^max-age=\d{7,}/);
    expect(securityHeaders({ production: false })["Strict-Transport-Security"]).toBeUndefined();
  });
});

describe("mail catcher switch", () => {
  it("is on only with both the local-catcher and the page switch", () => {
    expect(mailCatcherPageEnabled({ POURLINE_FAKE_SMTP: "1", POURLINE_DEV_MAILBOX: "1" })).toBe(true);
    expect(mailCatcherPageEnabled({ POURLINE_FAKE_SMTP: "1" })).toBe(false);
    expect(mailCatcherPageEnabled({ POURLINE_DEV_MAILBOX: "1" })).toBe(false);
    expect(mailCatcherPageEnabled({})).toBe(false);
  });
});
