import AxeBuilder from "@axe-core/playwright";
import { expect, test } from "@playwright/test";
import { signIn } from "./support/demo-users";

// The bench's first screen is in the server's HTML (keypad and all), so a tablet paints it before
// any of the bench's own code has arrived; that code comes as its own script right after. Until
// it has, the shell takes no taps; if it cannot be loaded, the shell says so and tries again.

test("the bench's first screen, keypad included, is in the server's HTML and is replaced by the live bench", async ({ page }) => {
  await signIn(page, "mechanic");
  const html = await (await page.request.get("/bench")).text();
  expect(html).toContain('data-testid="bench-shell"');
  for (const key of ["Key 1", "Key A", "Key Z", "Key -"]) expect(html).toContain(`aria-label="${key}"`);
  expect(html).toContain("Scan a bike&#x27;s tag");
  expect(html).toContain("Open this bike&#x27;s job");
  // the live bench is not in the HTML: it is the script's to draw
  expect(html).not.toContain('data-testid="bench-root"');

  await page.goto("/bench");
  await expect(page.getByTestId("bench-root")).toBeVisible();
  await expect(page.getByTestId("bench-shell")).toHaveCount(0);
  await page.getByRole("button", { name: "Key A", exact: true }).click();
  await expect(page.getByTestId("tag-display")).toHaveText("A");
});

test("when the bench's code cannot be loaded the shell says so in words, takes no taps, and Try again brings the bench", async ({
  browser,
}) => {
  const context = await browser.newContext({ serviceWorkers: "block" });
  const page = await context.newPage();
  await signIn(page, "mechanic");
  let refuse = true;
  // the bench's own script (it holds the IndexedDB library) is refused while `refuse` is on
  await page.route("**/_next/static/chunks/*.js", async (route) => {
    const res = await route.fetch();
    const body = await res.text();
    if (refuse && body.includes("Dexie")) return route.abort("internetdisconnected");
    return route.fulfill({ response: res, body });
  });
  await page.goto("/bench");
  const alert = page.getByRole("alert").filter({ hasText: "could not be loaded" });
  await expect(alert).toContainText(
    "The bench's code could not be loaded on this tablet. Connect it to the shop's network, then try again.",
  );
  await expect(page.getByTestId("bench-root")).toHaveCount(0);
  // the keypad is there but takes no taps
  await expect(page.getByRole("button", { name: "Key A", exact: true })).toBeDisabled();
  await page.getByRole("button", { name: "Key A", exact: true }).click({ force: true });
  await expect(page.getByTestId("tag-display")).toHaveText("tag code");
  const axe = await new AxeBuilder({ page }).analyze();
  expect(axe.violations.map((v) => `${v.id}: ${v.help}`)).toEqual([]);

  refuse = false;
  await alert.getByRole("button", { name: "Try again" }).click();
  await expect(page.getByTestId("bench-root")).toBeVisible();
  await page.getByRole("button", { name: "Key A", exact: true }).click();
  await expect(page.getByTestId("tag-display")).toHaveText("A");
  await context.close();
});
