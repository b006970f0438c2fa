import { expect, test } from "@playwright/test";
import { query } from "./support/e2e-db";
import { typeNumber, typeTag, waitForServiceWorker, waitForSynced } from "./support/bench-pad";
import { signIn } from "./support/demo-users";

// Demo job #1006 (tag GSW-0006) is in build and assigned to the mechanic Tomas Reyes.
// Its first step reads cylinder 1's bore at six places.
const BORE = ["76.004", "76.006", "76.003", "76.005", "76.002", "76.004"];

test("a mechanic records a step offline, reloads offline, and every entry reaches PostgreSQL once", async ({ page, context }) => {
  page.on("pageerror", (e) => console.log(`[page error] ${e.message}`));
  await signIn(page, "mechanic");
  await expect(page).toHaveURL(/\/bench$/);
  await waitForServiceWorker(page);
  await waitForSynced(page);
  await expect(page.getByText("Vireo Nine Fifty").first()).toBeVisible();

  await context.setOffline(true);
  await expect(page.getByTestId("net-state")).toHaveText(/Offline/);
  await typeTag(page, "GSW-0006");
  await page.getByRole("button", { name: "Open this bike's job" }).click();
  await expect(page.getByRole("heading", { name: "Vireo Nine Fifty" })).toBeVisible();
  await page.getByRole("button", { name: /Carry on: step 1/ }).click();
  await expect(page.getByTestId("step-title")).toHaveText("Bore gauge cylinder 1");
  await page.getByRole("button", { name: "I have read these cautions" }).click();
  for (const v of BORE) {
    await typeNumber(page, v);
    await page.getByRole("button", { name: "Save reading" }).click();
    await expect(page.getByRole("status").filter({ hasText: "saved" })).toContainText(`${v} mm saved`);
  }
  await expect(page.getByTestId("bore-geometry")).toContainText("Taper (max) 0.002 mm");
  await expect(page.getByTestId("waiting-count")).toHaveText("6 waiting to send");
  await page.getByRole("button", { name: "Step done" }).click();
  await expect(page.getByTestId("step-title")).toHaveText("Piston-to-wall clearance");
  await expect(page.getByTestId("waiting-count")).toHaveText("7 waiting to send");

  // The page comes back from the service worker with the network still off, work intact.
  await page.reload();
  await expect(page.getByTestId("net-state")).toHaveText(/Offline/);
  await expect(page.getByTestId("waiting-count")).toHaveText("7 waiting to send");
  await expect(page.getByTestId("step-title")).toHaveText("Piston-to-wall clearance");

  const before = await query(
    "SELECT count(*)::int AS n FROM measurements m JOIN work_orders w ON w.id = m.work_order_id WHERE w.number = 1006",
  );
  expect(before[0].n).toBe(0);

  await context.setOffline(false);
  await waitForSynced(page);
  // Sync twice more: nothing may arrive twice.
  await page.getByRole("button", { name: "Sync now" }).click();
  await waitForSynced(page);

  const readings = await query<{ value: string; reading_index: number; verdict: string }>(
    "SELECT m.value::text, m.reading_index, m.verdict FROM measurements m JOIN work_orders w ON w.id = m.work_order_id WHERE w.number = 1006 ORDER BY m.reading_index",
  );
  expect(readings.map((r) => r.value)).toEqual(BORE);
  expect(readings.map((r) => r.reading_index)).toEqual([0, 1, 2, 3, 4, 5]);
  expect(readings.every((r) => r.verdict === "in")).toBe(true);
  const done = await query(
    "SELECT count(*)::int AS n FROM step_completions c JOIN work_orders w ON w.id = c.work_order_id WHERE w.number = 1006",
  );
  expect(done[0].n).toBe(1);
  const ops = await query(
    "SELECT count(*)::int AS n, count(DISTINCT o.id)::int AS d FROM operations o JOIN work_orders w ON w.id = o.work_order_id WHERE w.number = 1006",
  );
  expect(ops[0]).toEqual({ n: 7, d: 7 });
});

test("a photo taken offline stays on the tablet, then reaches object storage when the network returns", async ({ page, context }) => {
  // A small PNG made here (1×1 pixel, valid file) stands in for the camera picture.
  const png = Buffer.from("iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mP8z8BQDwAEhQGAhKmMIQAAAABJRU5ErkJggg==", "base64");
  await signIn(page, "mechanic");
  await waitForServiceWorker(page);
  await waitForSynced(page);
  await context.setOffline(true);
  await typeTag(page, "GSW-0006");
  await page.getByRole("button", { name: "Open this bike's job" }).click();
  await page.getByRole("button", { name: /10\. Head face flatness/ }).click();
  await expect(page.getByTestId("step-title")).toHaveText("Head face flatness");
  await expect(page.getByTestId("step-missing")).toContainText("Take at least one photo");
  await page.getByTestId("photo-input").setInputFiles({ name: "deck.png", mimeType: "image/png", buffer: png });
  await expect(page.getByAltText("Step photo")).toHaveCount(1);
  await expect(page.getByText("on tablet", { exact: true })).toBeVisible();
  await expect(page.getByTestId("step-missing")).not.toContainText("Take at least one photo");

  await context.setOffline(false);
  await waitForSynced(page);
  await page.getByRole("button", { name: "Sync now" }).click();
  await expect(page.getByText("sent", { exact: true })).toBeVisible({ timeout: 30_000 });
  const rows = await query<{ id: string; awaiting_upload: boolean; byte_size: number }>(
    "SELECT a.id, a.awaiting_upload, a.byte_size FROM attachments a JOIN work_orders w ON w.id = a.work_order_id WHERE w.number = 1006 AND a.purpose = 'step'",
  );
  expect(rows).toHaveLength(1);
  expect(rows[0]).toMatchObject({ awaiting_upload: false, byte_size: png.byteLength });
  const res = await page.request.get(`/api/bench/photos/${rows[0].id}`);
  expect(res.status()).toBe(200);
  expect(res.headers()["content-type"]).toBe("image/png");
  expect(Buffer.from(await res.body()).equals(png)).toBe(true);
});
