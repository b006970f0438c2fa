import { describe, expect, it } from "vitest";
import { pageSecurityPolicy } from "@/lib/security-headers";

describe("the pages' Content-Security-Policy", () => {
  const policy = Object.fromEntries(
    pageSecurityPolicy("abc123", { dev: false })
      .split("; ")
      .map((d) => [d.split(" ")[0], d.split(" ").slice(1).join(" ")]),
  );
  it("runs scripts only with the nonce (or loaded by one), never inline or eval'd", () => {
    expect(policy["script-src"]).toBe("'self' 'nonce-abc123' 'strict-dynamic'");
    expect(policy["style-src"]).toBe("'self' 'nonce-abc123'");
    expect(JSON.stringify(policy)).not.toMatch(/unsafe-eval|\*/);
  });
  it("may not be framed, has no plugins and no base tag", () => {
    expect([policy["frame-ancestors"], policy["object-src"], policy["base-uri"]]).toEqual(["'none'", "'none'", "'none'"]);
  });
  it("lets the service worker, the camera stream and the tablet's photos work", () => {
    expect(policy["worker-src"]).toBe("'self'");
    expect(policy["media-src"]).toContain("blob:");
    expect(policy["img-src"]).toContain("blob:");
  });
});
