import { describe, expect, it } from "vitest";
import { judgeLink, type LinkFacts } from "@/lib/customer-contact/invitation-rules";
import { messageSchema, progressUpdateSchema, setPasswordSchema } from "@/lib/customer-contact/schemas";

const now = new Date("2026-12-06T10:00:00Z");
const link = (over: Partial<LinkFacts> = {}): LinkFacts => ({
  userId: "u1",
  userActive: true,
  expiresAt: new Date("2026-12-08T10:00:00Z"),
  usedAt: null,
  newerSent: false,
  ...over,
});

describe("judgeLink", () => {
  it("lets a fresh, unused, newest link of an active sign-in through, signed out or signed in as its own user", () => {
    expect(judgeLink(link(), now, null)).toEqual({ ok: true });
    expect(judgeLink(link(), now, "u1")).toEqual({ ok: true });
  });

  it("names each reason a link does not work", () => {
    const reason = (l: LinkFacts | null, who: string | null = null) => {
      const v = judgeLink(l, now, who);
      return v.ok ? "ok" : `${v.status} ${v.reason}`;
    };
    expect(reason(null)).toBe("404 unknown");
    expect(reason(link(), "u2")).toBe("403 other-customer");
    expect(reason(link({ usedAt: now }))).toBe("409 used");
    expect(reason(link({ newerSent: true }))).toBe("409 retired");
    expect(reason(link({ expiresAt: now }))).toBe("409 expired"); // the expiry instant itself is too late
    expect(reason(link({ userActive: false }))).toBe("409 turned-off");
  });

  it("says every refusal changed nothing", () => {
    for (const l of [null, link({ usedAt: now }), link({ newerSent: true }), link({ expiresAt: now })]) {
      const v = judgeLink(l, now, null);
      expect(!v.ok && v.message).toMatch(/Nothing was changed\./);
    }
  });
});

describe("customer contact input", () => {
  it("refuses hostile text in workshop words", () => {
    const first = (r: { success: boolean; error?: { issues: Array<{ message: string }> } }) => r.error?.issues[0].message;
    expect(first(messageSchema.safeParse({ body: "a\u0000b" }))).toBe("Message holds a NUL character, which cannot be stored: retype it.");
    expect(first(messageSchema.safeParse({ body: "\ud800" }))).toMatch(/^Message holds a broken character/);
    expect(first(messageSchema.safeParse({ body: "   " }))).toBe("Enter the message.");
    expect(first(progressUpdateSchema.safeParse({ note: "ok", photoIds: Array(13).fill("00000000-0000-4000-8000-000000000001") }))).toBe(
      "Photos: at most 12 in one update.",
    );
    expect(first(setPasswordSchema.safeParse({ token: "x", password: "long-enough-1", repeat: "long-enough-1" }))).toBe(
      "the link is incomplete: open it from the e-mail again",
    );
  });
});
