import { expect, test } from "@playwright/test";
import { signIn } from "./support/demo-users";

// Addresses no page of the app links to — a cut-off %-escape, a NUL, numbers past any integer, a
// job's id where another kind belongs — are answered in words or as "not found", never as a
// server error, on pages and API routes alike (the server in front of Next answers a path that
// does not decode, with a page for a page: server.mjs).

const BROKEN = "This address is not valid: part of it is a broken %-escape. Check the link.";

test("a broken %-escape anywhere in the path is answered 400 in words: a page for pages, the one error body for API routes", async ({
  request,
  page,
}) => {
  for (const p of ["/api/office/customers/%E0%A4%A", "/api/bench/tags/%F0%9F"]) {
    const res = await request.get(p, { maxRedirects: 0 });
    expect([p, res.status()]).toEqual([p, 400]);
    expect(await res.json()).toEqual({ error: BROKEN, issues: [] });
    expect(res.headers()["x-content-type-options"]).toBe("nosniff");
  }
  for (const p of ["/welcome/%E0%A4%A", "/office/work-orders/%F0%9F", "/bench/%C3", "/review/%"]) {
    const res = await page.goto(p);
    expect([p, res?.status()]).toEqual([p, 400]);
    await expect(page.getByRole("heading", { name: "Address not valid" })).toBeVisible();
    await expect(page.getByText(BROKEN)).toBeVisible();
    await page.getByRole("link", { name: "Go to Benchtag's start page" }).click();
    await expect(page).toHaveURL(/\/(signin|bench|office|review|my-bikes)?(\?.*)?$/);
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
