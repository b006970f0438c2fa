import { expect, test } from "@playwright/test";
import { signIn } from "./support/demo-users";

// The office header at 1024 × 768: one row, 64 px (it took 236 px, three rows, before the links beyond the
// first few moved into "More"), every page still reachable from it, and sign out one click away.

test("the office header fits one row at 1024 × 768, and every page is reachable from it", async ({ page }) => {
  await page.setViewportSize({ width: 1024, height: 768 });
  await signIn(page, "office");
  await page.goto("/office");
  const header = page.locator("header").first();
  await expect(header).toBeVisible();
  await page.screenshot({ path: "test-results/office-header-1024.png", clip: { x: 0, y: 0, width: 1024, height: 300 } });
  const box = (await header.boundingBox())!;
  console.log(`office header at 1024 px: ${box.height} px of 768`);
  // one row: the 48 px links and 12 px padding either side; nothing wraps to a second row
  expect(box.height).toBeLessThanOrEqual(80);
  const nav = page.getByRole("navigation", { name: "Main" });
  const tops = await nav
    .locator(":scope > a, :scope > details > summary")
    .evaluateAll((els) => els.map((e) => Math.round(e.getBoundingClientRect().top)));
  expect(new Set(tops).size).toBe(1);
  // the pages beyond the row are one click away, in "More"
  await nav.getByText("More").click();
  await nav.getByRole("link", { name: "E-mail outbox" }).click();
  await expect(page).toHaveURL(/\/office\/outbox-mail/);
});

test("the header takes at most two rows at 768 × 1024", async ({ page }) => {
  await page.setViewportSize({ width: 768, height: 1024 });
  await signIn(page, "office");
  await page.goto("/office");
  const box = (await page.locator("header").first().boundingBox())!;
  await page.screenshot({ path: "test-results/office-header-768.png", clip: { x: 0, y: 0, width: 768, height: 300 } });
  console.log(`office header at 768 px: ${box.height} px of 1024`);
  expect(box.height).toBeLessThanOrEqual(136);
});
