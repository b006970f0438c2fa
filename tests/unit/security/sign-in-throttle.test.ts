import { describe, expect, it } from "vitest";
import { bucketKey, parseBucketKey, SIGN_IN_WAITS, waitAfter, waitLeft, waitMessage } from "@/lib/auth/sign-in-throttle";

describe("sign-in waits", () => {
  it("let the first failures through, then double the wait up to five minutes", () => {
    const waits = Array.from({ length: 14 }, (_, n) => waitAfter(n, SIGN_IN_WAITS.pair));
    expect(waits).toEqual([0, 0, 0, 2, 4, 8, 16, 32, 64, 128, 256, 300, 300, 300]);
    expect(waitAfter(10_000, SIGN_IN_WAITS.address)).toBe(300);
  });

  it("count the wait from the last failure", () => {
    expect(waitLeft(5, 3, SIGN_IN_WAITS.pair)).toBe(5); // 8 s asked, 3 s gone
    expect(waitLeft(5, 9, SIGN_IN_WAITS.pair)).toBe(0);
    expect(waitLeft(2, 0, SIGN_IN_WAITS.pair)).toBe(0);
    expect(waitLeft(5, null, SIGN_IN_WAITS.pair)).toBe(0);
  });

  it("never refuse per account alone: the account bucket has a pause, no wait rule", () => {
    expect(SIGN_IN_WAITS.account).toEqual({ free: 10, pauseMs: 1500 });
    expect("capS" in SIGN_IN_WAITS.account).toBe(false);
  });

  it("name buckets so the office can read them back", () => {
    const pair = bucketKey("pair", { email: "a|b@example.test", address: "192.0.2.1" });
    expect(parseBucketKey(pair)).toEqual({ kind: "pair", email: "a|b@example.test", address: "192.0.2.1" });
    expect(parseBucketKey(bucketKey("address", { address: "2001:db8::/64" }))).toEqual({
      kind: "address",
      email: null,
      address: "2001:db8::/64",
    });
    expect(parseBucketKey("email:old@example.test")).toBeNull();
  });

  it("say how long to wait in words", () => {
    expect(waitMessage(1)).toBe("Too many wrong passwords from here. Wait 1 second, then try again.");
    expect(waitMessage(300)).toBe("Too many wrong passwords from here. Wait 5 minutes, then try again.");
  });
});
