import { describe, expect, it } from "vitest";
import { forwardedForToPass, isTrustedPeer, trustedProxyList } from "./peer-address.mjs";

describe("forwardedForToPass", () => {
  const none = trustedProxyList(undefined);
  const proxy = trustedProxyList("10.0.0.5, 192.168.7.0/24");

  it("forwardedForToPass -- without a trusted proxy a forged header is replaced by the socket's address", () => {
    expect(forwardedForToPass("203.0.113.9", "1.2.3.4", none)).toBe("203.0.113.9");
    expect(forwardedForToPass("::ffff:127.0.0.1", ["9.9.9.9", "8.8.8.8"], none)).toBe("127.0.0.1");
    expect(forwardedForToPass("203.0.113.9", undefined, none)).toBe("203.0.113.9");
  });

  it("forwardedForToPass -- from a trusted proxy the chain is kept and the proxy appended", () => {
    expect(forwardedForToPass("10.0.0.5", "198.51.100.4", proxy)).toBe("198.51.100.4, 10.0.0.5");
    expect(forwardedForToPass("::ffff:192.168.7.20", "198.51.100.4", proxy)).toBe("198.51.100.4, 192.168.7.20");
  });

  it("forwardedForToPass -- an untrusted neighbour of the proxy range is not trusted", () => {
    expect(forwardedForToPass("192.168.8.1", "198.51.100.4", proxy)).toBe("192.168.8.1");
    expect(isTrustedPeer("10.0.0.6", proxy)).toBe(false);
    expect(isTrustedPeer(undefined, proxy)).toBe(false);
  });

  it("trustedProxyList -- names the entry that is not an address or range", () => {
    expect(() => trustedProxyList("10.0.0.1, proxy.local")).toThrow('"proxy.local" is not an IP address');
    expect(() => trustedProxyList("10.0.0.0/40")).toThrow("invalid prefix length");
    expect(isTrustedPeer("::1", trustedProxyList("::1"))).toBe(true);
  });
});
