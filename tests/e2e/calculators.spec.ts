import { expect, test } from "@playwright/test";
import { signIn } from "./support/demo-users";
import { goByHeader } from "./support/nav";

test("engine numbers: compression, boosted compression and charge air against worked examples", async ({ page }) => {
  await signIn(page, "mechanic");
  await goByHeader(page, "Numbers");
  await expect(page.getByRole("heading", { level: 1, name: "Engine numbers" })).toBeVisible();

  // Heywood, Internal Combustion Engine Fundamentals ch. 2 formula; worked values from
  // ../shared REFERENCE-CHECKS (bore 86, stroke 86, chamber 45 cc, gasket 87 × 1.1, deck 0.2, dish 5 → 9.6577:1).
  const fill = async (id: string, v: string) => page.locator(`#${id}`).fill(v);
  await fill("cr-bore", "86");
  await fill("cr-stroke", "86");
  await fill("cr-chamber", "45");
  await fill("cr-dish", "5");
  await fill("cr-gbore", "87");
  await fill("cr-gthick", "1.1");
  await fill("cr-deck", "0.2");
  await page.locator("#cr-boost").fill("10");
  const cr = page.getByTestId("cr-result");
  await expect(cr).toContainText("9.66:1");
  // boosted rule of thumb (common practice, no source): 9.6577 × (101.325 + 68.948) / 101.325 = 16.23
  await expect(cr).toContainText("16.2:1");

  await fill("cr-bore", "-86");
  await expect(page.getByTestId("cr-error")).toContainText("boreMm");
  await fill("cr-bore", "eighty");
  await expect(page.getByTestId("cr-error")).toContainText('Bore: enter a number (got "eighty")');

  // NASA Glenn compressor relations, worked in REFERENCE-CHECKS: 20 °C, 10 psi (PR 1.6805), η 0.72 → 85.09 °C;
  // then an intercooler of effectiveness 0.75 with 20 °C ambient → 20 + 0.25 × 65.09 = 36.27 °C.
  await page.locator("#ca-inlet").fill("20");
  await page.locator("#ca-boost").fill("10");
  await page.locator("#ca-amb").fill("101.325");
  await page.locator("#ca-eff").fill("72");
  await page.locator("#ca-ic").fill("75");
  const ca = page.getByTestId("ca-result");
  await expect(ca).toContainText("1.680");
  await expect(ca).toContainText("85.1 °C");
  await expect(ca).toContainText("36.3 °C");

  // oil clearance = bore − journal, at the readings' decimals
  await expect(page.getByTestId("oil-result")).toContainText("Clearances 0.032 mm, 0.031 mm, 0.033 mm");
  // torque: 40 N·m = 29.502 lbf·ft (NIST SP 811: 1 lbf·ft = 1.3558179483314 N·m)
  await expect(page.getByTestId("torque-result")).toContainText("29.502 lbf·ft");
});

test("customers do not get the engine numbers page", async ({ page }) => {
  await signIn(page, "customer");
  await page.goto("/calculators");
  await expect(page).toHaveURL(/\/my-bikes\?refused=calculators/);
});
