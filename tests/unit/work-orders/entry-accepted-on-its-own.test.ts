import { describe, expect, it } from "vitest";
import { entryAcceptedOnItsOwn, type OpenItem } from "@/lib/work-orders/open-items";

const item = (over: Partial<OpenItem>): OpenItem => ({
  key: "flagged_not_accepted:6f1c2b9e-8a51-4c59-9d7e-1f0e3c2a4b5d",
  kind: "flagged_not_accepted",
  stage: null,
  step: null,
  reason: "Step done flagged and not accepted: Work order #7 is closed (Handed over); kept for review.",
  signOffId: null,
  ...over,
});

describe("which open item is a flagged entry accepted on its own", () => {
  it("a closed job's flagged entry with no sign-off to carry it: its entry id", () => {
    expect(entryAcceptedOnItsOwn(item({}), true)).toBe("6f1c2b9e-8a51-4c59-9d7e-1f0e3c2a4b5d");
  });

  it("not when a sign-off carries it, the job is open, or the item is of another kind", () => {
    expect(entryAcceptedOnItsOwn(item({ signOffId: "0b6e1f55-3c1d-4f0a-9a3e-5d2c7b8e9f10" }), true)).toBeNull();
    expect(entryAcceptedOnItsOwn(item({}), false)).toBeNull();
    expect(
      entryAcceptedOnItsOwn(item({ kind: "reading_not_accepted", key: "reading_not_accepted:6f1c2b9e-8a51-4c59-9d7e-1f0e3c2a4b5d" }), true),
    ).toBeNull();
  });
});
