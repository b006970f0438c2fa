import { expect, test } from "@playwright/test";
import { query } from "./support/e2e-db";
import { typeTag, waitForServiceWorker, waitForSynced } from "./support/bench-pad";
import { signIn } from "./support/demo-users";

// Time at the bench. Demo job #1060 (tag GSW-0060) is in build, assigned to Tomas Reyes, with an
// approved quote of 3.50 h labour; #1061 has a clock Priya Vance left running since yesterday.

test("a mechanic clocks on and off offline, syncs, and the office sees the hours against the quote", async ({ page, browser }) => {
  await signIn(page, "mechanic");
  await waitForServiceWorker(page);
  await waitForSynced(page);
  await expect(page.getByText("Brackwater Fell 700").first()).toBeVisible();

  await page.context().setOffline(true);
  await expect(page.getByTestId("net-state")).toHaveText(/Offline/);
  await typeTag(page, "GSW-0060");
  await page.getByRole("button", { name: "Open this bike's job" }).click();
  await expect(page.getByRole("heading", { name: "Brackwater Fell 700" })).toBeVisible();
  const status = page.getByTestId("clock-status");
  await expect(status).toHaveText(/Off the clock on this job/);

  // the big control: at least 64 px, words, colour and a shape
  await page.getByRole("button", { name: "Measure before assembly" }).click();
  const on = page.getByTestId("clock-on");
  await expect(on).toHaveText(/▶ Clock on: Measure before assembly/);
  const box = (await on.boundingBox())!;
  expect(box.height).toBeGreaterThanOrEqual(64);
  await on.click();
  await expect(status).toHaveText(/On the clock · Measure before assembly since \d\d:\d\d .*waiting to send/);
  await expect(page.getByTestId("clock-panel")).toHaveClass(/border-pass/);
  await expect(page.getByTestId("waiting-count")).toHaveText("1 waiting to send");
  await page.screenshot({ path: "test-results/bench-clock-on-1024.png" });

  // a little over half a minute on the clock counts as one minute (nearest minute)
  await page.waitForTimeout(35_000);
  const off = page.getByTestId("clock-off");
  await expect(off).toHaveText(/■ Clock off/);
  await off.click();
  await expect(status).toHaveText(/Off the clock on this job/);
  await expect(page.getByTestId("waiting-count")).toHaveText("2 waiting to send");
  const before = await query(
    "SELECT count(*)::int AS n FROM bench_clocks c JOIN work_orders w ON w.id = c.work_order_id WHERE w.number = 1060",
  );
  expect(before[0].n).toBe(0);

  await page.context().setOffline(false);
  await waitForSynced(page);
  await page.getByRole("button", { name: "Sync now" }).click();
  await waitForSynced(page);
  const clocks = await query<{ stage_key: string; minutes: number; ends: number }>(
    `SELECT c.stage_key, round(extract(epoch FROM (e.ended_at - c.started_at)) / 60)::int AS minutes,
       (SELECT count(*)::int FROM bench_clock_ends x WHERE x.clock_id = c.id) AS ends
     FROM bench_clocks c JOIN work_orders w ON w.id = c.work_order_id JOIN bench_clock_ends e ON e.clock_id = c.id WHERE w.number = 1060`,
  );
  expect(clocks).toEqual([{ stage_key: "measure", minutes: 1, ends: 1 }]);

  // the office's work order: hours per stage and per person against the quoted labour
  const office = await browser.newPage();
  await signIn(office, "office");
  const [job] = await query<{ id: string }>("SELECT id FROM work_orders WHERE number = 1060");
  await office.goto(`/office/work-orders/${job.id}`);
  const hours = office.getByTestId("hours-panel");
  await expect(hours.getByTestId("hours-clocked")).toHaveText("0.02 h");
  await expect(hours.getByTestId("hours-quoted")).toHaveText("3.50 h");
  await expect(hours.getByTestId("hours-difference")).toHaveText("3.48 h");
  await expect(hours).toContainText("Within the quote");
  await expect(hours.getByTestId("hours-by-stage")).toContainText("Measure before assembly");
  await expect(hours.getByTestId("hours-by-stage")).toContainText("1 min");
  await expect(hours.getByTestId("hours-by-person")).toContainText("Tomas Reyes");
  // figures line up: right-aligned, tabular digits
  const align = await hours
    .getByTestId("hours-clocked")
    .evaluate((el) => [getComputedStyle(el).textAlign, getComputedStyle(el).fontVariantNumeric]);
  expect(align).toEqual(["right", "tabular-nums"]);
  await hours.screenshot({ path: "test-results/office-hours-1024.png" });
  await office.close();
});

test("a supervisor closes a clock left running, with a reason; the record says who, when and why", async ({ page }) => {
  await signIn(page, "supervisor");
  await page.goto("/review");
  const running = page.getByTestId("running-clock").filter({ hasText: "#1061" });
  await expect(running).toContainText("Priya Vance");
  await running.getByRole("button", { name: "Close this clock with a reason" }).click();
  const form = running.getByTestId("close-clock-form");
  // an end before the clock-on is refused with the reason
  const [clock] = await query<{ id: string; started_at: Date }>(
    "SELECT c.id, c.started_at FROM bench_clocks c JOIN work_orders w ON w.id = c.work_order_id WHERE w.number = 1061",
  );
  const browserOffset = await page.evaluate(() => new Date().getTimezoneOffset());
  const inBrowser = (ms: number) => new Date(ms - browserOffset * 60_000).toISOString().slice(0, 16);
  await form.getByLabel("Ended at").fill(inBrowser(clock.started_at.getTime() - 3_600_000));
  await form.getByLabel("Reason").fill("Went home, tablet stayed on");
  await form.getByRole("button", { name: "Close this clock" }).click();
  await expect(form.getByTestId("error-endedAt")).toContainText("before the clock-on");
  await form.getByLabel("Ended at").fill(inBrowser(clock.started_at.getTime() + 8.5 * 3_600_000));
  await form.getByRole("button", { name: "Close this clock" }).click();
  await expect(page.getByTestId("running-clock").filter({ hasText: "#1061" })).toHaveCount(0);
  const ends = await query<{ kind: string; reason: string; by: string }>(
    "SELECT e.kind, e.reason, u.name AS by FROM bench_clock_ends e JOIN users u ON u.id = e.recorded_by WHERE e.clock_id = $1",
    [clock.id],
  );
  expect(ends).toEqual([{ kind: "closed-by-supervisor", reason: "Went home, tablet stayed on", by: "Dana Kowal" }]);
});
