import { describe, expect, it } from "vitest";
import { addressKey, clientAddress, parseTrustedHops } from "@/lib/auth/client-address";

describe("the client address a sign-in is counted against", () => {
  it("believes no X-Forwarded-For by default: the connection address counts, whatever the client wrote", () => {
    for (const forwardedFor of [null, "203.0.113.9", "198.51.100.1, 203.0.113.9"])
      expect(clientAddress({ peer: "192.0.2.10", forwardedFor, hops: 0 })).toBe("192.0.2.10");
  });

  it("with one trusted proxy, takes the address that proxy saw, not what the client put before it", () => {
    // client 198.51.100.7 → proxy 192.0.2.1 (appends the client) → app
    expect(clientAddress({ peer: "192.0.2.1", forwardedFor: "198.51.100.7", hops: 1 })).toBe("198.51.100.7");
    // the client sent its own header: the proxy appended the real address after it
    expect(clientAddress({ peer: "192.0.2.1", forwardedFor: "10.9.9.9, 198.51.100.7", hops: 1 })).toBe("198.51.100.7");
    // two proxies
    expect(clientAddress({ peer: "192.0.2.2", forwardedFor: "10.9.9.9, 198.51.100.7, 192.0.2.1", hops: 2 })).toBe("198.51.100.7");
  });

  it("without our server's stamp, reads the last proxy's entry (trusted hops) or counts everyone as one", () => {
    expect(clientAddress({ peer: null, forwardedFor: "10.9.9.9, 198.51.100.7", hops: 1 })).toBe("198.51.100.7");
    expect(clientAddress({ peer: null, forwardedFor: "198.51.100.7", hops: 0 })).toBe("unknown");
  });

  it("counts IPv4-mapped addresses as IPv4 and IPv6 by /64", () => {
    expect(addressKey("::ffff:127.0.0.2")).toBe("127.0.0.2");
    expect(addressKey("2001:db8:1:2:aaaa::1")).toBe("2001:db8:1:2::/64");
    expect(addressKey("2001:db8:1:2:bbbb:cccc:dddd:eeee")).toBe("2001:db8:1:2::/64");
    expect(addressKey("::1")).toBe("0:0:0:0::/64");
  });

  it("reads the trusted-proxy setting as a small whole number, else 0", () => {
    expect([parseTrustedHops(undefined), parseTrustedHops("1"), parseTrustedHops("two"), parseTrustedHops("-1")]).toEqual([0, 1, 0, 0]);
  });
});
