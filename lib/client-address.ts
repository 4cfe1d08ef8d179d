import { BlockList, isIP } from "node:net";

/**
 * The client's network address, for throttling (issue 12 finding 1).
 *
 * `next start` gives route handlers no socket: it only fills `x-forwarded-for` from the socket when the
 * request has none (`??=` in next/dist/server/base-server.js), so a client's own `X-Forwarded-For` reaches
 * the handler untouched and the socket address is lost. `installPeerStamp()` (run once at server start from
 * instrumentation.ts) therefore hooks the Node HTTP server's "request" event, before Next sees the request,
 * and acts like a well-behaved proxy: it appends the socket address to `x-forwarded-for` and records it in
 * `x-plateau-peer` (overwriting anything a client sent under that name). The right-most hop is then always
 * the socket address, and `PLATEAU_TRUSTED_PROXIES` says how many hops to its left can be believed:
 *
 * - unset, empty or `0`: no proxy; the socket address is the client (any `X-Forwarded-For` is ignored).
 * - a hop count `N` (e.g. `1` for one reverse proxy): the client is the address N hops left of the socket.
 * - a comma list of proxy addresses or CIDR ranges (e.g. `127.0.0.1, 10.0.0.0/8, ::1`): walking from the
 *   right, hops whose address is in the list are proxies; the first one that is not is the client.
 */

export type ProxyTrust = { kind: "none" } | { kind: "hops"; hops: number } | { kind: "list"; list: BlockList; text: string };

export class TrustedProxiesError extends Error {}

export function parseTrustedProxies(value: string | undefined): ProxyTrust {
  const text = (value ?? "").trim();
  if (text === "" || text === "0") return { kind: "none" };
  if (/^\d+$/.test(text)) {
    const hops = Number(text);
    if (hops > 20) throw new TrustedProxiesError(`PLATEAU_TRUSTED_PROXIES: a hop count of ${hops} is not plausible (at most 20).`);
    return { kind: "hops", hops };
  }
  const list = new BlockList();
  for (const raw of text.split(",")) {
    const entry = raw.trim();
    if (!entry) continue;
    const [addr, bits, extra] = entry.split("/");
    const family = isIP(addr ?? "");
    if (!addr || family === 0 || extra !== undefined) {
      throw new TrustedProxiesError(`PLATEAU_TRUSTED_PROXIES: "${entry}" is not an IP address, a CIDR range or a hop count.`);
    }
    const type = family === 6 ? "ipv6" : "ipv4";
    if (bits === undefined) {
      list.addAddress(addr, type);
    } else {
      const prefix = Number(bits);
      if (!/^\d+$/.test(bits) || prefix > (family === 6 ? 128 : 32)) {
        throw new TrustedProxiesError(`PLATEAU_TRUSTED_PROXIES: "${entry}" has an invalid prefix length.`);
      }
      list.addSubnet(addr, prefix, type);
    }
  }
  return { kind: "list", list, text };
}

/** "::ffff:192.0.2.1" → "192.0.2.1", "[2001:db8::1]:443" → "2001:db8::1", "192.0.2.1:5000" → "192.0.2.1"; else trimmed as is. */
export function normaliseAddress(raw: string): string {
  let a = raw.trim();
  const bracketed = /^\[([^\]]+)\](?::\d+)?$/.exec(a);
  if (bracketed?.[1]) a = bracketed[1];
  const v4port = /^(\d{1,3}(?:\.\d{1,3}){3}):\d+$/.exec(a);
  if (v4port?.[1]) a = v4port[1];
  if (/^::ffff:\d{1,3}(?:\.\d{1,3}){3}$/i.test(a)) a = a.slice(7);
  return a.slice(0, 100);
}

function trusted(list: BlockList, addr: string): boolean {
  const family = isIP(addr);
  return family !== 0 && list.check(addr, family === 6 ? "ipv6" : "ipv4");
}

/** The client among the hops (left = farthest from us, right-most = the socket address). */
export function resolveClientAddress(chain: string[], trust: ProxyTrust): string | null {
  const hops = chain.map(normaliseAddress).filter((h) => h !== "");
  if (hops.length === 0) return null;
  const last = hops.length - 1;
  if (trust.kind === "none") return hops[last]!;
  if (trust.kind === "hops") return hops[Math.max(0, last - trust.hops)]!;
  for (let i = last; i > 0; i--) if (!trusted(trust.list, hops[i]!)) return hops[i]!;
  return hops[0]!;
}

/** The throttling key of an address: IPv6 clients by their /64 (one subscriber's network), IPv4 as is. */
export function addressKey(addr: string): string {
  if (isIP(addr) !== 6) return addr;
  const [head = "", tail = ""] = addr.toLowerCase().split("::");
  const left = head ? head.split(":") : [];
  const right = tail ? tail.split(":") : [];
  const groups = addr.includes("::") ? [...left, ...Array<string>(Math.max(0, 8 - left.length - right.length)).fill("0"), ...right] : left;
  return `${groups
    .slice(0, 4)
    .map((g) => g.replace(/^0+(?=.)/, ""))
    .join(":")}::/64`;
}

export const PEER_HEADER = "x-plateau-peer";
/** "https" when the socket itself is TLS, else "http" (set by the same hook). */
export const PEER_PROTO_HEADER = "x-plateau-peer-proto";

const g = globalThis as unknown as { __plateauPeerStamp?: boolean; __plateauTrust?: ProxyTrust };

/** The trust setting, parsed once per process (an invalid setting trusts no proxy; instrumentation reports it). */
export function proxyTrust(): ProxyTrust {
  if (!g.__plateauTrust) {
    try {
      g.__plateauTrust = parseTrustedProxies(process.env.PLATEAU_TRUSTED_PROXIES);
    } catch {
      g.__plateauTrust = { kind: "none" };
    }
  }
  return g.__plateauTrust;
}

/** Whether `installPeerStamp` ran in this process (otherwise headers alone cannot be trusted). */
export function peerStampInstalled(): boolean {
  return g.__plateauPeerStamp === true;
}

type NodeRequestLike = { headers: Record<string, string | string[] | undefined>; socket?: { remoteAddress?: string; encrypted?: boolean } | null };

/** What the hook does to one request: append the socket address to x-forwarded-for and record it. */
export function stampPeer(req: NodeRequestLike): void {
  const peer = normaliseAddress(req.socket?.remoteAddress ?? "") || "unknown";
  const prior = req.headers["x-forwarded-for"];
  const before = (Array.isArray(prior) ? prior.join(", ") : (prior ?? "")).trim();
  req.headers["x-forwarded-for"] = before ? `${before}, ${peer}` : peer;
  req.headers[PEER_HEADER] = peer;
  req.headers[PEER_PROTO_HEADER] = req.socket?.encrypted ? "https" : "http";
}

/** Hook every Node HTTP(S) server's "request" event once per process (see the comment at the top). */
export function installPeerStamp(serverClasses: { prototype: object }[]): void {
  if (g.__plateauPeerStamp) return;
  for (const cls of serverClasses) {
    const proto = cls.prototype as unknown as { emit: (this: unknown, event: string | symbol, ...args: unknown[]) => boolean };
    const original = proto.emit;
    proto.emit = function (this: unknown, event: string | symbol, ...args: unknown[]) {
      if (event === "request" && args[0] && typeof args[0] === "object") stampPeer(args[0] as NodeRequestLike);
      return original.call(this, event, ...args);
    };
  }
  g.__plateauPeerStamp = true;
}

/**
 * The client address of a request seen by a route handler, or null when the peer stamp is missing (a
 * runtime where instrumentation did not run): then no address-based limit applies, never a spoofable one.
 */
export function clientAddress(headers: Headers, trust: ProxyTrust = proxyTrust()): string | null {
  const peer = headers.get(PEER_HEADER);
  if (!peerStampInstalled() || !peer) return null;
  const chain = (headers.get("x-forwarded-for") ?? "").split(",");
  // The stamp appended the peer last; if something else rewrote the header since, believe only the peer.
  if (normaliseAddress(chain[chain.length - 1] ?? "") !== peer) return peer;
  return resolveClientAddress(chain, trust);
}
