import { expect, test, type Page } from "@playwright/test";
import { query } from "./support/e2e-db";
import { typeTag, waitForServiceWorker, waitForSynced } from "./support/bench-pad";
import { signIn } from "./support/demo-users";
import { acknowledgeCautions, openStep, readOpenSpots, typeIn } from "./support/review-bench";

// A tap records what it shows, once: a double tap (two presses straight after each other) on "Save reading" or
// "Step done" records one entry, as on the torque confirm (bench-screen-truth.spec.ts). Demo job
// #1074 (tag GSW-1074, bottom end, kept for trying by hand; no other test records on it), step 2
// (piston-to-wall clearance, two readings); step 1 (the bore) for "Step done" then at once "All steps".

async function doubleTap(page: Page, name: string, scope = page.locator("body")) {
  const button = scope.getByRole("button", { name });
  await expect(button).toBeEnabled();
  await button.scrollIntoViewIfNeeded();
  const box = (await button.boundingBox())!;
  const [x, y] = [box.x + box.width / 2, box.y + box.height / 2];
  // a glove's bounce: the second press straight after the first, while its save is being written
  await page.mouse.click(x, y);
  await page.mouse.click(x, y);
}

const recorded = async () =>
  (
    await query<{ readings: number; done: number }>(
      `SELECT (SELECT count(*)::int FROM measurements m WHERE m.work_order_id = w.id AND m.step_id = s.id) AS readings,
              (SELECT count(*)::int FROM step_completions c WHERE c.work_order_id = w.id AND c.step_id = s.id) AS done
       FROM work_orders w JOIN job_procedures jp ON jp.work_order_id = w.id
       JOIN template_steps s ON s.template_version_id = jp.template_version_id AND s.key = 'piston-clearance'
       WHERE w.number = 1074`,
    )
  )[0];

test("a double tap on Save reading records one reading, and on Step done one completion", async ({ page }) => {
  await signIn(page, "mechanic");
  await waitForServiceWorker(page);
  await waitForSynced(page);
  const before = await recorded();
  await typeTag(page, "GSW-1074");
  await page.getByRole("button", { name: "Open this bike's job" }).click();
  await expect(page.getByRole("heading", { name: "Oxmoor Vane 650" })).toBeVisible();
  await openStep(page, 2);
  const sections = page.getByRole("region", { name: /^Measure / });
  await expect(sections).toHaveCount(2);
  for (let i = 0; i < 2; i++) {
    const section = sections.nth(i);
    await section.getByRole("button").filter({ hasText: "not read" }).first().click();
    await typeIn(section, "0.061");
    await doubleTap(page, "Save reading", section);
    await expect(section.getByRole("status").filter({ hasText: "saved" })).toContainText("0.061 mm saved");
  }
  await page.waitForTimeout(700);
  await expect(page.getByTestId("waiting-count")).toHaveText(/^(2 waiting to send|Nothing waiting to send)$/);
  await doubleTap(page, "Step done");
  await waitForSynced(page);
  await expect(page.getByTestId("waiting-count")).toHaveText("Nothing waiting to send");
  const after = await recorded();
  expect(after).toEqual({ readings: before.readings + 2, done: before.done + 1 });
});

test("Step done then at once All steps: the step is recorded and the tablet stays on All steps, not pulled on to the next step", async ({
  page,
}) => {
  await signIn(page, "mechanic");
  await waitForServiceWorker(page);
  await waitForSynced(page);
  await typeTag(page, "GSW-1074");
  await page.getByRole("button", { name: "Open this bike's job" }).click();
  await expect(page.getByRole("heading", { name: "Oxmoor Vane 650" })).toBeVisible();
  await openStep(page, 1);
  await acknowledgeCautions(page);
  await readOpenSpots(page, { "Cylinder 1 bore": "76.005" });
  const jobHash = new URL(page.url()).hash.replace(/\/step\/\d+$/, "");
  // both taps in one go: "All steps" lands while "Step done" is still being written to the tablet's store
  await page.evaluate(() => {
    const button = (name: string) => [...document.querySelectorAll("button")].find((b) => b.textContent?.trim() === name)!;
    button("Step done").click();
    button("All steps").click();
  });
  await expect(page.getByRole("button", { name: /Bore gauge cylinder 1/ })).toContainText("Done");
  await page.waitForTimeout(1000); // the save has long finished: nothing moves the screen any more
  expect(new URL(page.url()).hash).toBe(jobHash);
  await expect(page.getByText(/^Step \d+ of \d+$/)).toHaveCount(0);
  await waitForSynced(page);
});

test("Open this bike's job then at once Scan a bike's tag: the tablet stays on the scan screen when the look-up ends", async ({ page }) => {
  await signIn(page, "mechanic");
  await waitForServiceWorker(page);
  await waitForSynced(page);
  await typeTag(page, "GSW-1074");
  // both taps in one go: "Scan" lands while the tag is still being looked up in the tablet's store
  await page.evaluate(() => {
    const button = (name: string) => [...document.querySelectorAll("button")].find((b) => b.textContent?.trim() === name)!;
    button("Open this bike's job").click();
    button("Scan a bike's tag").click();
  });
  await expect(page).toHaveURL(/#\/scan$/);
  await page.waitForTimeout(1000); // the look-up has long finished: nothing moves the screen any more
  await expect(page).toHaveURL(/#\/scan$/);
  await expect(page.getByRole("heading", { name: "Oxmoor Vane 650" })).toHaveCount(0);
});
