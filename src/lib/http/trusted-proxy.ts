/**
 * Who is on the other end of a request. The app is served by scripts/serve.mjs, which writes the socket's
 * peer address into PEER_HEADER (replacing any copy a client sent). Forwarded headers (X-Forwarded-For,
 * -Host, -Proto) are believed only when that peer is a configured trusted proxy (TRUSTED_PROXY or
 * POURLINE_TRUSTED_PROXIES: comma-separated addresses or CIDR ranges); otherwise anyone could pick the
 * address their failed sign-ins are counted under.
 */
import { BlockList, isIP } from "node:net";

export const PEER_HEADER = "x-pourline-peer";

/** "::ffff:10.0.0.1" (an IPv4 client on a dual-stack socket) is the IPv4 address 10.0.0.1. */
export function normalizeAddress(address: string): string {
  const a = address.trim().replace(/^\[|\]$/g, "");
  const mapped = /^::ffff:(\d+\.\d+\.\d+\.\d+)$/i.exec(a);
  return mapped ? mapped[1] : a;
}

export function parseTrustedProxies(setting: string | undefined): BlockList {
  const list = new BlockList();
  for (const raw of (setting ?? "").split(",").map((s) => s.trim()).filter(Boolean)) {
    const [addr, bits] = raw.split("/");
    const ip = normalizeAddress(addr);
    const family = isIP(ip);
    if (!family) throw new Error(`TRUSTED_PROXY: "${raw}" is not an IP address or CIDR range`);
    const type = family === 6 ? "ipv6" : "ipv4";
    if (bits === undefined) list.addAddress(ip, type);
    else list.addSubnet(ip, Number(bits), type);
  }
  return list;
}

let cached: { setting: string; list: BlockList } | null = null;
function configuredProxies(): BlockList {
  const setting = process.env.POURLINE_TRUSTED_PROXIES ?? process.env.TRUSTED_PROXY ?? "";
  if (!cached || cached.setting !== setting) cached = { setting, list: parseTrustedProxies(setting) };
  return cached.list;
}

export function isTrustedProxy(address: string, list: BlockList = configuredProxies()): boolean {
  const ip = normalizeAddress(address);
  const family = isIP(ip);
  return family !== 0 && list.check(ip, family === 6 ? "ipv6" : "ipv4");
}

/** The peer the server saw, or "unknown" when the app was not started through scripts/serve.mjs. */
export function peerAddress(headers: Headers): string {
  const peer = headers.get(PEER_HEADER);
  return peer ? normalizeAddress(peer) : "unknown";
}

/** True when this request reached us through a configured proxy, so its forwarded headers may be read. */
export function fromTrustedProxy(headers: Headers, list?: BlockList): boolean {
  return isTrustedProxy(peerAddress(headers), list);
}

/**
 * The client's address: the peer itself, or — behind trusted proxies — the right-most X-Forwarded-For entry
 * that is not one of them (entries further left were written by the client and prove nothing).
 */
export function clientAddress(headers: Headers, list: BlockList = configuredProxies()): string {
  const peer = peerAddress(headers);
  if (!isTrustedProxy(peer, list)) return peer;
  const chain = (headers.get("x-forwarded-for") ?? "").split(",").map((s) => normalizeAddress(s)).filter(Boolean);
  for (let i = chain.length - 1; i >= 0; i--) if (!isTrustedProxy(chain[i], list)) return chain[i];
  return peer;
}
