import { describe, expect, it } from "vitest";
import { signOutTo } from "@/lib/client/sign-out";

// Signing out without next-auth's client library: the CSRF token next-auth hands out goes back
// with the sign-out post, as a form, with the page to land on.

describe("signing out", () => {
  it("fetches next-auth's token and posts it with the sign-out", async () => {
    const calls: Array<{ url: string; method: string; body: string }> = [];
    const fetchFn = (async (input: RequestInfo | URL, init?: RequestInit) => {
      calls.push({ url: String(input), method: init?.method ?? "GET", body: String(init?.body ?? "") });
      return String(input) === "/api/auth/csrf" ? Response.json({ csrfToken: "tok-123" }) : Response.json({ url: "/signin" });
    }) as typeof fetch;

    expect(await signOutTo("/signin", fetchFn)).toBe("/signin");

    expect(calls.map((c) => [c.url, c.method])).toEqual([
      ["/api/auth/csrf", "GET"],
      ["/api/auth/signout", "POST"],
    ]);
    expect(Object.fromEntries(new URLSearchParams(calls[1].body))).toEqual({ csrfToken: "tok-123", callbackUrl: "/signin", json: "true" });
  });

  it("fails when the server does not take it, so the page can say it did not sign out", async () => {
    const fetchFn = (async (input: RequestInfo | URL) =>
      String(input) === "/api/auth/csrf" ? Response.json({ csrfToken: "t" }) : new Response("", { status: 503 })) as typeof fetch;
    await expect(signOutTo("/signin", fetchFn)).rejects.toThrow("503");
  });
});
