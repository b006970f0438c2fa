import { describe, expect, it } from "vitest";
import { extraWorkLinkShowsDetails } from "@/lib/office/extra-work";

// What the page of an e-mailed extra-work link shows, by who opens it and when.
const owner = "00000000-0000-4000-8000-000000000001";
const other = "00000000-0000-4000-8000-000000000002";
const now = new Date("2026-12-10T12:00:00Z");
const link = (kind: "open" | "used" | "expired", expiresAt: string) => ({ kind, customerId: owner, expiresAt: new Date(expiresAt) });
const anonymous = { signedIn: false, customerId: null };

describe("the extra-work link's page", () => {
  it("shows the finding to a visitor holding the link until the link's end, used or not", () => {
    expect(extraWorkLinkShowsDetails(link("open", "2026-12-20T00:00:00Z"), anonymous, now)).toBe(true);
    expect(extraWorkLinkShowsDetails(link("used", "2026-12-20T00:00:00Z"), anonymous, now)).toBe(true);
  });

  it("stops showing it to such a visitor once the link has ended: a forwarded link does not show the job for ever", () => {
    expect(extraWorkLinkShowsDetails(link("expired", "2026-12-01T00:00:00Z"), anonymous, now)).toBe(false);
    expect(extraWorkLinkShowsDetails(link("used", "2026-12-01T00:00:00Z"), anonymous, now)).toBe(false);
  });

  it("always shows it to its customer signed in, never to another customer, and to staff", () => {
    const ended = link("used", "2026-12-01T00:00:00Z");
    expect(extraWorkLinkShowsDetails(ended, { signedIn: true, customerId: owner }, now)).toBe(true);
    expect(extraWorkLinkShowsDetails(link("open", "2026-12-20T00:00:00Z"), { signedIn: true, customerId: other }, now)).toBe(false);
    expect(extraWorkLinkShowsDetails(ended, { signedIn: true, customerId: null }, now)).toBe(true);
  });

  it("shows nothing for a link that is not ours", () => {
    expect(extraWorkLinkShowsDetails({ kind: "unknown" }, anonymous, now)).toBe(false);
  });
});
