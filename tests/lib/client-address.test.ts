import http from "node:http";
import type { AddressInfo } from "node:net";
import { describe, expect, it } from "vitest";
import {
  TrustedProxiesError,
  addressKey,
  clientAddress,
  installPeerStamp,
  normaliseAddress,
  parseTrustedProxies,
  resolveClientAddress,
  stampPeer,
} from "@/lib/client-address";

// Issue 12 finding 1: X-Forwarded-For is believed only as far as PLATEAU_TRUSTED_PROXIES says (OWASP ASVS 4.0.3
// 2.2.1 rate limits must not be bypassable; the right-most hop is the socket address).

describe("PLATEAU_TRUSTED_PROXIES", () => {
  it("parses none, a hop count and a list of addresses and CIDR ranges", () => {
    expect(parseTrustedProxies(undefined)).toEqual({ kind: "none" });
    expect(parseTrustedProxies(" ")).toEqual({ kind: "none" });
    expect(parseTrustedProxies("0")).toEqual({ kind: "none" });
    expect(parseTrustedProxies("2")).toEqual({ kind: "hops", hops: 2 });
    const l = parseTrustedProxies("127.0.0.1, 10.0.0.0/8, ::1");
    expect(l.kind).toBe("list");
  });

  it("refuses entries that are not addresses, ranges or counts", () => {
    for (const bad of ["proxy.example", "10.0.0.0/33", "1.2.3.4/8/1", "300.1.1.1", "50"]) {
      expect(() => parseTrustedProxies(bad)).toThrow(TrustedProxiesError);
    }
  });
});

describe("resolveClientAddress", () => {
  const chain = ["198.51.100.8", "203.0.113.7", "10.0.0.2", "127.0.0.1"]; // spoofed, client, inner proxy, socket
  it("without trusted proxies the socket address wins whatever the header says", () => {
    expect(resolveClientAddress(chain, parseTrustedProxies(""))).toBe("127.0.0.1");
  });
  it("a hop count believes exactly that many hops left of the socket", () => {
    expect(resolveClientAddress(chain, parseTrustedProxies("1"))).toBe("10.0.0.2");
    expect(resolveClientAddress(chain, parseTrustedProxies("2"))).toBe("203.0.113.7");
    expect(resolveClientAddress(["127.0.0.1"], parseTrustedProxies("3"))).toBe("127.0.0.1");
  });
  it("a list skips trusted proxies from the right and stops at the first untrusted hop (a spoofed prefix is never reached)", () => {
    expect(resolveClientAddress(chain, parseTrustedProxies("127.0.0.1, 10.0.0.0/8"))).toBe("203.0.113.7");
    expect(resolveClientAddress(["127.0.0.1", "127.0.0.1"], parseTrustedProxies("127.0.0.1"))).toBe("127.0.0.1");
  });
  it("normalises mapped IPv4, ports and brackets", () => {
    expect(normaliseAddress("::ffff:192.0.2.1")).toBe("192.0.2.1");
    expect(normaliseAddress(" 192.0.2.1:5000 ")).toBe("192.0.2.1");
    expect(normaliseAddress("[2001:db8::1]:443")).toBe("2001:db8::1");
    expect(addressKey("2001:db8::1")).toBe("2001:db8:0:0::/64");
    expect(addressKey("192.0.2.1")).toBe("192.0.2.1");
  });
});

describe("the peer stamp on a real Node HTTP server", () => {
  it("appends the socket address to x-forwarded-for and overwrites a client's x-plateau-peer", async () => {
    installPeerStamp([http.Server]);
    let seen: Headers | undefined;
    const server = http.createServer((req, res) => {
      seen = new Headers(Object.entries(req.headers).map(([k, v]): [string, string] => [k, Array.isArray(v) ? v.join(", ") : (v ?? "")]));
      res.end("ok");
    });
    await new Promise<void>((r) => server.listen(0, "127.0.0.1", r));
    try {
      const port = (server.address() as AddressInfo).port;
      await fetch(`http://127.0.0.1:${port}/`, { headers: { "x-forwarded-for": "198.51.100.8", "x-plateau-peer": "198.51.100.9" } });
      expect(seen?.get("x-forwarded-for")).toBe("198.51.100.8, 127.0.0.1");
      expect(seen?.get("x-plateau-peer")).toBe("127.0.0.1");
      expect(clientAddress(seen!, parseTrustedProxies(""))).toBe("127.0.0.1");
      expect(clientAddress(seen!, parseTrustedProxies("127.0.0.1"))).toBe("198.51.100.8");
    } finally {
      server.close();
    }
  });

  it("stampPeer on a request without the header records the socket address alone", () => {
    const req = { headers: {} as Record<string, string>, socket: { remoteAddress: "::ffff:203.0.113.9" } };
    stampPeer(req);
    expect(req.headers).toEqual({ "x-forwarded-for": "203.0.113.9", "x-plateau-peer": "203.0.113.9", "x-plateau-peer-proto": "http" });
  });
});
