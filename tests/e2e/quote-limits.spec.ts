import { expect, test } from "@playwright/test";
import { signIn } from "./support/demo-users";
import { query } from "./support/e2e-db";

// The quote form's live totals with lines that together pass the most a quote holds
// (100,000,000.00): the form keeps working and says so when saved, and nothing is saved. (The
// totals used to be worked out for any lines that passed each line's own check, and threw.)
test("a quote too large for the record is refused in words; the form keeps working", async ({ page }) => {
  const errors: string[] = [];
  page.on("pageerror", (e) => errors.push(e.message));
  const [job] = await query<{ id: string; number: number }>(
    "SELECT id, number FROM work_orders WHERE title = 'Intake and exhaust upgrade, dyno tune' AND status = 'quoted'",
  );
  const versionsBefore = await query("SELECT id FROM quotes WHERE work_order_id = $1", [job.id]);
  await signIn(page, "office");
  await page.goto(`/office/work-orders/${job.id}`);
  const quote = page.getByTestId("quote-section");
  await expect(quote.getByRole("heading", { name: "Revise the quote (a new version)" })).toBeVisible();
  // a line each of whose figures is within its own limit (20,000 × 9,999,999.99), 199,999,999,800.00 in all
  await quote.getByLabel("Line 1 description").fill("Race engines, complete");
  await quote.getByLabel("Line 1 quantity").fill("20000");
  await quote.getByLabel("Line 1 unit price").fill("9999999.99");
  await quote.getByRole("button", { name: "Save draft" }).click();
  await expect(page.getByTestId("form-error")).toHaveText("Check the marked fields.");
  await expect(quote.getByText("✖ together the lines come to more than 100,000,000.00, the most one quote can hold")).toBeVisible();
  // the form still answers: a sensible price is taken and its total shown as typed
  await quote.getByLabel("Line 1 quantity").fill("2");
  await quote.getByLabel("Line 1 unit price").fill("1500.00");
  // 2 × £1,500.00 = £3,000.00 on its line, and the totals are worked out again
  await expect(quote.getByTestId("quote-line").first()).toContainText("£3,000.00");
  await expect(quote.getByTestId("quote-total")).toHaveText(/^£[\d,]+\.\d\d$/);
  expect(errors).toEqual([]);
  expect(await query("SELECT id FROM quotes WHERE work_order_id = $1", [job.id])).toEqual(versionsBefore);
});
