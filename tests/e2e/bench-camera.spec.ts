import { expect, test } from "@playwright/test";
import { FAKE_CAMERA_TAG } from "./global-setup";
import { typeTag, waitForSynced } from "./support/bench-pad";
import { signIn } from "./support/demo-users";

// The camera here is Chromium's fake device playing a QR tag made by tests/e2e/global-setup.ts
// (GSW-0003, the Ostrava S4 Street on job #1002, assigned to Priya Vance).

test("scanning a bike's QR tag with the camera opens its job", async ({ page }) => {
  await signIn(page, "mechanic2");
  await waitForSynced(page);
  await page.getByRole("button", { name: "Scan a bike's tag" }).click();
  await expect(page.getByRole("heading", { name: "Ostrava S4 Street" })).toBeVisible({ timeout: 30_000 });
  await expect(page.getByText(`tag ${FAKE_CAMERA_TAG}`)).toBeVisible();
});

test("an unknown tag typed on the keypad is reported clearly", async ({ page }) => {
  await signIn(page, "mechanic2");
  await waitForSynced(page);
  await typeTag(page, "GSW-9999");
  await page.getByRole("button", { name: "Open this bike's job" }).click();
  await expect(page.getByTestId("tag-message")).toContainText("GSW-9999");
});
