import { expect, test, type Page } from "@playwright/test";
import { typeTag } from "./support/bench-pad";
import { signIn } from "./support/demo-users";
import { goByHeader } from "./support/nav";

// After handover. Demo job #1040 (tag GSW-1040, a Tern Velo 750 of Ida Brannock) was handed over
// with readings and a batch of rod bearings on record; #1041's run-in check is overdue.

const SIZES = [
  { width: 1024, height: 768 },
  { width: 768, height: 1024 },
];

/** Each tablet size: the page fits without sideways scrolling, and a screenshot to look at. */
async function checkSizes(page: Page, name: string) {
  for (const size of SIZES) {
    await page.setViewportSize(size);
    expect(await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)).toBeLessThanOrEqual(0);
    await page.screenshot({ path: `test-results/aftercare-screens/${name}-${size.width}x${size.height}.png`, fullPage: true });
  }
  await page.setViewportSize(SIZES[0]);
}

test("a mechanic scanning a handed-over bike is told to ask; a supervisor opens a come-back from the scan and sees the original build beside it", async ({
  browser,
}) => {
  const mech = await browser.newContext();
  const mp = await mech.newPage();
  await signIn(mp, "mechanic");
  await expect(mp).toHaveURL(/\/bench$/);
  await typeTag(mp, "GSW-1040");
  await mp.getByRole("button", { name: "Open this bike's job" }).click();
  await expect(mp.getByTestId("tag-message")).toHaveText(
    /^Bike GSW-1040 was handed over on .+ \(job #1040\) and has no open job\. If it is back with a fault, ask the office or a supervisor to open a come-back\.$/,
  );
  await expect(mp.getByTestId("come-back-offer")).toHaveCount(0);
  // the come-back pages are not the mechanic's: sent back to the bench
  await mp.goto("/come-backs");
  await expect(mp).toHaveURL(/\/bench\?refused=come-backs$/);
  await mech.close();

  const context = await browser.newContext();
  const page = await context.newPage();
  await signIn(page, "supervisor");
  await page.goto("/bench");
  await typeTag(page, "GSW-1040");
  await page.getByRole("button", { name: "Open this bike's job" }).click();
  await expect(page.getByTestId("tag-message")).toContainText("open a come-back linked to job #1040");
  await checkSizes(page, "bench-handed-over");
  await page.getByTestId("come-back-offer").click();

  await expect(page.getByRole("heading", { name: "Open a come-back" })).toBeVisible();
  await page.getByRole("button", { name: "Open a come-back of job #1040" }).click();
  await expect(page.getByTestId("error-riderReport")).toHaveText("✖ Write down what the rider reports.");
  await page.getByLabel("What the rider reports").fill("Knock from the bottom end when warm, 600 km after collection.");
  await page.getByLabel("Odometer now (km)").fill("15650");
  await page.getByLabel("Yes, claims warranty").check();
  await page.getByRole("button", { name: "Open a come-back of job #1040" }).click();

  await expect(page.getByRole("heading", { name: /^Come-back #\d+ of job #1040$/ })).toBeVisible();
  await expect(page.getByTestId("warranty-claimed")).toContainText("claimed by the rider");
  const part = page.getByTestId("sbs-parts-row").filter({ hasText: "RB-2207" });
  await expect(part.getByTestId("then")).toContainText("batch LOT-26-0412");
  await expect(part.getByTestId("now")).toHaveText("not yet recorded");
  const reading = page.getByTestId("sbs-readings-row").filter({ hasText: "Piston-to-wall, cyl 1" });
  await expect(reading.getByTestId("then")).toContainText("0.062 mm");
  await expect(reading.getByTestId("then")).toContainText("✔ in limits");

  await page.getByLabel("What caused it").selectOption("part_failed");
  await page.getByLabel("Yes, under warranty").check();
  await page.getByLabel("What was found").fill("Rod bearing shell of batch LOT-26-0412 picked up; shells replaced from another batch.");
  await page.getByRole("button", { name: "Record the finding" }).click();
  await expect(page.getByTestId("finding")).toContainText("▶ Current: A part failed · under warranty");
  await checkSizes(page, "come-back");

  await page.getByRole("link", { name: "◀ Come-backs" }).click();
  await expect(page.getByTestId("by-batch").getByTestId("batch-row").filter({ hasText: "LOT-26-0412" })).toContainText("1 jobs");
  await expect(page.getByTestId("by-template").getByTestId("template-row").first()).toBeVisible();
  await checkSizes(page, "come-backs-list");
  await context.close();
});

test("the office sees the overdue run-in check and records it done", async ({ page }) => {
  await signIn(page, "office");
  await goByHeader(page, "Reminders");
  const row = page
    .getByTestId("reminders-due")
    .getByTestId("reminder-row")
    .filter({ hasText: "#1041" })
    .filter({ hasText: "Run-in check" });
  await expect(row).toContainText("✖ Overdue");
  await expect(row).toContainText("Ardley Six Hundred");
  await checkSizes(page, "reminders");
  await row.getByRole("button", { name: "Record done: Run-in check and first oil change, job #1041" }).click();
  await row.getByLabel("Note (optional)").fill("Oil and filter changed, filter clean.");
  await row.getByLabel("Odometer (km, optional)").fill("15020");
  await row.getByRole("button", { name: "Done — record it" }).click();
  const done = page.getByTestId("reminders-done").getByTestId("reminder-row").filter({ hasText: "#1041" });
  await expect(done).toContainText("✔ Done");
  await expect(done).toContainText("by Maren Ostby — Oil and filter changed, filter clean.");
  await expect(page.getByTestId("reminders-due").getByTestId("reminder-row").filter({ hasText: "#1041" })).toHaveCount(0);

  // the work order shows its reminders and offers a come-back; so does the bike's page
  await done.getByRole("link", { name: "#1041" }).click();
  const after = page.getByTestId("aftercare");
  await expect(after.getByTestId("work-order-reminders")).toContainText("Run-in check and first oil change");
  await expect(after.getByTestId("work-order-reminders")).toContainText("Done");
  await expect(after.getByTestId("open-come-back-link")).toBeVisible();
  await page
    .getByRole("link", { name: /Ardley Six Hundred/ })
    .first()
    .click();
  await expect(page.getByTestId("bike-come-back-link")).toHaveText("Back with a fault? Open a come-back of job #1041");
});
