import AxeBuilder from "@axe-core/playwright";
import { expect, test } from "@playwright/test";
import { query } from "./support/e2e-db";
import { typeTag, waitForServiceWorker, waitForSynced } from "./support/bench-pad";
import { demoUser, signIn } from "./support/demo-users";

// Demo job #1006 (tag GSW-0006), assigned to the mechanic Tomas Reyes. Step 5 of its list is
// "Torque connecting-rod bolts", where a serial-numbered connecting rod goes in.
const SERIAL = "GSE-R-2231";

test("a mechanic records a serial-numbered part at a step offline; it reaches PostgreSQL once and shows on the office's work order", async ({
  page,
  context,
  browser,
}) => {
  page.on("pageerror", (e) => console.log(`[page error] ${e.message}`));
  const mechanic = await signIn(page, "mechanic");
  await waitForServiceWorker(page);
  await waitForSynced(page);

  await context.setOffline(true);
  await expect(page.getByTestId("net-state")).toHaveText(/Offline/);
  await typeTag(page, "GSW-0006");
  await page.getByRole("button", { name: "Open this bike's job" }).click();
  await page.getByRole("button", { name: /5\. Torque connecting-rod bolts/ }).click();
  await expect(page.getByTestId("step-title")).toHaveText("Torque connecting-rod bolts");

  const parts = page.getByRole("region", { name: "Parts fitted here" });
  await expect(parts).toContainText("No parts recorded at this step.");
  await parts.getByRole("button", { name: "Record a part fitted here" }).click();
  await parts.getByLabel("Part number").fill("GSE-CR-130");
  await parts.getByLabel("Description").fill("H-beam connecting rod, cyl 1");

  // Neither a serial nor a batch number: the form says what is missing, and nothing is queued.
  await parts.getByRole("button", { name: "Save part" }).click();
  await expect(parts.getByText("give the serial number or the batch number (or both)")).toBeVisible();
  await expect(page.getByTestId("waiting-count")).toHaveText("Nothing waiting to send");
  // The open form, with its error showing, passes the same checks as the other bench screens.
  const axe = await new AxeBuilder({ page })
    .include("section[aria-labelledby^='parts-']")
    .withTags(["wcag2a", "wcag2aa", "wcag21aa", "wcag22aa"])
    .analyze();
  expect(axe.violations.map((v) => `${v.id} (${v.nodes.length}) ${v.help}`)).toEqual([]);

  await parts.getByLabel("Serial number").fill(SERIAL);
  await expect(parts.getByTestId("part-quantity")).toHaveText("1");
  await expect(parts.getByRole("button", { name: "One more" })).toBeDisabled();
  await parts.getByRole("button", { name: "Save part" }).click();
  await expect(parts.getByRole("status")).toContainText(`1 × GSE-CR-130 saved, serial ${SERIAL}.`);
  const line = parts.getByTestId("step-part");
  await expect(line).toHaveCount(1);
  await expect(line).toContainText("1 × GSE-CR-130 H-beam connecting rod, cyl 1");
  await expect(line).toContainText(`serial ${SERIAL}`);
  await expect(line).toContainText("fitted by Tomas Reyes · ⏳ waiting to send");
  await expect(page.getByTestId("waiting-count")).toHaveText("1 waiting to send");

  // Still there after a reload with the network off.
  await page.reload();
  await expect(page.getByTestId("net-state")).toHaveText(/Offline/);
  await expect(page.getByTestId("step-part")).toContainText(`serial ${SERIAL}`);
  expect(await query("SELECT id FROM parts_fitted WHERE serial = $1", [SERIAL])).toEqual([]);

  await context.setOffline(false);
  await waitForSynced(page);
  await page.getByRole("button", { name: "Sync now" }).click();
  await waitForSynced(page);
  await expect(page.getByTestId("step-part")).toContainText("fitted by Tomas Reyes · ✔ on record");

  const rows = await query<{
    id: string;
    part_number: string;
    quantity: number;
    fitted_by: string;
    step: string;
    number: number;
    operation_id: string;
  }>(
    `SELECT p.id, p.part_number, p.quantity, u.email AS fitted_by, s.title AS step, w.number, p.operation_id
     FROM parts_fitted p JOIN users u ON u.id = p.fitted_by JOIN template_steps s ON s.id = p.step_id JOIN work_orders w ON w.id = p.work_order_id
     WHERE p.serial = $1`,
    [SERIAL],
  );
  expect(rows).toEqual([
    {
      id: expect.any(String),
      part_number: "GSE-CR-130",
      quantity: 1,
      fitted_by: mechanic.email,
      step: "Torque connecting-rod bolts",
      number: 1006,
      operation_id: expect.any(String),
    },
  ]);
  const ops = await query<{ n: number }>(
    "SELECT count(*)::int AS n FROM operations WHERE kind = 'part.fitted' AND payload->>'serial' = $1",
    [SERIAL],
  );
  expect(ops).toEqual([{ n: 1 }]);
  const audit = await query<{ outcome: string }>("SELECT outcome FROM audit_log WHERE entity_id = $1", [rows[0].operation_id]);
  expect(audit).toEqual([{ outcome: "accepted" }]);

  // The office sees it on the work order, with the step and who fitted it.
  const office = await browser.newContext();
  const officePage = await office.newPage();
  await signIn(officePage, "office");
  const [job] = await query<{ id: string }>("SELECT id FROM work_orders WHERE number = 1006");
  await officePage.goto(`/office/work-orders/${job.id}`);
  const fitted = officePage.getByTestId("part-fitted").filter({ hasText: SERIAL });
  await expect(fitted).toHaveCount(1);
  await expect(fitted).toContainText("1 × GSE-CR-130 H-beam connecting rod, cyl 1");
  await expect(fitted).toContainText('at "Torque connecting-rod bolts"');
  await expect(fitted).toContainText(`fitted by ${demoUser("mechanic").name}`);
  await expect(fitted).toContainText("recorded at the bench");
  await office.close();
});
