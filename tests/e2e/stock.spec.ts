import { expect, test } from "@playwright/test";
import { query } from "./support/e2e-db";
import { typeTag, waitForServiceWorker, waitForSynced } from "./support/bench-pad";
import { signIn } from "./support/demo-users";

// Stock: the office receives a delivery of rod bolts by batch; a mechanic fits two of them at the
// bench on demo job #1070 (tag GSW-0070) with the network off; after the sync the office's stock
// page shows them drawn from the shelf, and the batch search finds the delivery and the fit.
const PART = "GSE-RB-907";
const BATCH = "RB-2612";

test("receive a delivery in the office, fit two at the bench offline, and see the stock drawn down after the sync", async ({
  page,
  context,
  browser,
}) => {
  page.on("pageerror", (e) => console.log(`[page error] ${e.message}`));

  // The office receives the delivery; a bad line first: a quantity that would take stock away.
  const office = await browser.newContext();
  const desk = await office.newPage();
  await signIn(desk, "office");
  await desk.goto("/office");
  const nav = desk.getByRole("navigation", { name: "Main" });
  await nav.getByText("More").click();
  await nav.getByRole("link", { name: "Stock" }).click();
  await expect(desk.getByRole("heading", { name: "Stock", level: 1 })).toBeVisible();
  const form = desk.getByRole("form", { name: "Receive a delivery" });
  await form.getByLabel("Supplier").fill("Tidewater Engine Spares");
  await form.getByLabel("Delivery note").fill("TES-41022");
  await form.getByLabel("Part number, line 1").fill(PART);
  await form.getByLabel("Description, line 1").fill("Connecting-rod bolt, 3/8 in");
  await form.getByLabel("Shelf, line 1").fill("Shelf B4");
  await form.getByLabel("Batch number, line 1").fill(BATCH);
  await form.getByLabel("Quantity, line 1").fill("-8");
  await form.getByRole("button", { name: "Receive delivery" }).click();
  await expect(form.getByText("✖ Quantity must be at least 1: a delivery cannot take stock away.")).toBeVisible();
  expect(await query("SELECT id FROM stock_lots WHERE batch = $1", [BATCH])).toEqual([]);

  await form.getByLabel("Quantity, line 1").fill("8");
  await form.getByLabel("Low-stock level, line 1").fill("2");
  await form.getByRole("button", { name: "Receive delivery" }).click();
  await expect(form.getByRole("status")).toHaveText("✔ Received: 1 line from Tidewater Engine Spares put on the shelf.");
  const lot = desk.getByTestId("lot-row").filter({ hasText: BATCH });
  await expect(lot).toContainText("Shelf B4");
  await expect(lot.getByTestId("lot-on-hand")).toHaveText("8");

  // The mechanic fits two of that batch with the network off.
  await signIn(page, "mechanic");
  await waitForServiceWorker(page);
  await waitForSynced(page);
  await context.setOffline(true);
  await expect(page.getByTestId("net-state")).toHaveText(/Offline/);
  await typeTag(page, "GSW-0070");
  await page.getByRole("button", { name: "Open this bike's job" }).click();
  await page.getByRole("button", { name: /Torque connecting-rod bolts/ }).click();
  const parts = page.getByRole("region", { name: "Parts fitted here" });
  await parts.getByRole("button", { name: "Record a part fitted here" }).click();
  await parts.getByLabel("Part number").fill(PART);
  await parts.getByLabel("Description").fill("Connecting-rod bolt, 3/8 in");
  await parts.getByLabel("Batch number").fill(BATCH);
  await parts.getByRole("button", { name: "One more" }).click();
  await expect(parts.getByTestId("part-quantity")).toHaveText("2");
  await parts.getByRole("button", { name: "Save part" }).click();
  await expect(parts.getByRole("status")).toContainText(`2 × ${PART} saved, batch ${BATCH}.`);
  await expect(page.getByTestId("waiting-count")).toHaveText("1 waiting to send");
  // Nothing has left the shelf while the tablet is offline.
  expect(await query("SELECT on_hand FROM stock_lots WHERE batch = $1", [BATCH])).toEqual([{ on_hand: 8 }]);

  await context.setOffline(false);
  await waitForSynced(page);
  await page.getByRole("button", { name: "Sync now" }).click();
  await waitForSynced(page);
  await expect(page.getByTestId("step-part")).toContainText("✔ on record");

  // Drawn once, in PostgreSQL and on the office's page.
  expect(await query("SELECT on_hand, reserved FROM stock_lots WHERE batch = $1", [BATCH])).toEqual([{ on_hand: 6, reserved: 0 }]);
  const drawn = await query<{ quantity: number; short: number; number: number }>(
    `SELECT m.quantity, m.short, w.number FROM stock_movements m JOIN stock_lots l ON l.id = m.lot_id JOIN work_orders w ON w.id = m.work_order_id
     WHERE m.kind = 'drawn' AND l.batch = $1`,
    [BATCH],
  );
  expect(drawn).toEqual([{ quantity: 2, short: 0, number: 1070 }]);
  await desk.reload();
  await expect(desk.getByTestId("lot-row").filter({ hasText: BATCH }).getByTestId("lot-on-hand")).toHaveText("6");

  // The batch search: received, then fitted on job #1070 and its bike.
  await desk.getByLabel("Batch or serial number").fill(BATCH.toLowerCase());
  await desk.getByRole("button", { name: "Search stock" }).click();
  const results = desk.getByTestId("stock-search-results");
  await expect(results).toContainText(`“${BATCH.toLowerCase()}”: 2 events, fitted to 1 bike`);
  await expect(results.getByTestId("stock-event-received")).toContainText("Tidewater Engine Spares · Shelf B4");
  await expect(results.getByTestId("stock-event-fitted")).toContainText("#1070");
  await expect(results.getByTestId("stock-event-fitted")).toContainText("GSW-0070");
  await desk.setViewportSize({ width: 1024, height: 768 });
  await desk.screenshot({ path: "test-results/stock-office-1024.png", fullPage: true });
  await desk.setViewportSize({ width: 768, height: 1024 });
  await desk.screenshot({ path: "test-results/stock-office-768.png", fullPage: true });
  await office.close();
});
