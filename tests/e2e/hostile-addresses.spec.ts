import { expect, test } from "@playwright/test";
import { signIn } from "./support/demo-users";

// Addresses no page of the app links to — a cut-off %-escape, a NUL, numbers past any integer, a
// job's id where another kind belongs — are answered in words or as "not found", never as a
// server error, on pages and API routes alike (the server in front of Next answers a path that
// does not decode: server.mjs).

const BROKEN = "This address is not valid: part of it is a broken %-escape. Check the link.";

test("a broken %-escape anywhere in the path is answered 400 in words, for pages and API routes", async ({ request }) => {
  for (const p of ["/welcome/%E0%A4%A", "/office/work-orders/%F0%9F", "/api/office/customers/%E0%A4%A", "/bench/%C3", "/review/%"]) {
    const res = await request.get(p, { maxRedirects: 0 });
    expect([p, res.status()]).toEqual([p, 400]);
    expect(await res.json()).toEqual({ error: BROKEN, issues: [] });
    expect(res.headers()["x-content-type-options"]).toBe("nosniff");
  }
  // a whole emoji, written out as its escapes, is an address like any other
  expect((await request.get("/office/work-orders/%F0%9F%8F%8D", { maxRedirects: 0 })).status()).toBeLessThan(500);
});

test("the office's pages given ids and queries no page sends answer without a server error", async ({ page }) => {
  await signIn(page, "office");
  const pages = [
    "/office/work-orders/{x}",
    "/office/bikes/{x}",
    "/office/customers/{x}",
    "/come-backs/{x}",
    "/jobs/{x}/dyno",
    "/jobs/{x}/numbers",
    "/come-backs/new?original={x}",
    "/office/labels?bike={x}",
    "/office/calendar?week={x}&resource={x}",
    "/office/templates/edit?key={x}",
    "/audit?from={x}&to={x}&q={x}",
  ];
  for (const tmpl of pages)
    for (const x of ["a%00b", "99999999999", "-1", "0000-01-01", "00000000-0000-4000-8000-000000000009"]) {
      const url = tmpl.replaceAll("{x}", x);
      const res = await page.request.get(url, { maxRedirects: 0 });
      expect([url, res.status() < 500]).toEqual([url, true]);
    }
  // a template key no template can have names none
  expect((await page.request.get("/office/templates/edit?key=bottom%00end", { maxRedirects: 0 })).status()).toBe(404);
});
