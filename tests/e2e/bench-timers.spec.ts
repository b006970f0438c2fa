import { expect, test, type Page } from "@playwright/test";
import { query } from "./support/e2e-db";
import { openJobByTag, waitForSynced } from "./support/bench-pad";
import { demoUser, signIn } from "./support/demo-users";
import { acknowledgeCautions, openStep } from "./support/review-bench";

// Stopping and cancelling a running timer from the bench, each with a reason. Demo job #1021 (tag
// GSW-0021, Shrike Sprint 900, bottom end, assigned to Tomas Reyes) is kept fresh for this file.
// The cure timer is started on step 7 ("Torque crankcase bolts") and holds step 8, the oil fill.
// The rules (lib/sync/holds.ts): a timer stopped before its time leaves the step it holds waiting
// (start it again, or a supervisor lets it go ahead); a cancelled timer no longer counts; the step
// is released once a timer has run its full time.

const CASE_BOLTS = 7;
const OIL_FILL = 8;
const CURE = "Sealant cure before oil and cranking";

async function openJob(page: Page) {
  await signIn(page, "mechanic");
  await waitForSynced(page);
  await openJobByTag(page, "GSW-0021", "Shrike Sprint 900");
}

const timerRows = () =>
  query<{
    started_by: string;
    stopped: boolean;
    stopped_by: string | null;
    stop_reason: string | null;
    cancelled: boolean;
    cancelled_by: string | null;
    cancel_reason: string | null;
  }>(
    `SELECT u.email AS started_by, t.stopped_at IS NOT NULL AS stopped, sb.email AS stopped_by, t.stop_reason,
            t.cancelled_at IS NOT NULL AS cancelled, cb.email AS cancelled_by, t.cancel_reason
     FROM timers t JOIN work_orders w ON w.id = t.work_order_id JOIN users u ON u.id = t.started_by
     LEFT JOIN users sb ON sb.id = t.stopped_by LEFT JOIN users cb ON cb.id = t.cancelled_by
     WHERE w.number = 1021 ORDER BY t.started_at`,
  );

/** Opens the oil fill and checks that it is held, with `why` in the hold at its top, and that nothing can be recorded on it. */
async function expectOilFillHeld(page: Page, why: string | RegExp) {
  await openStep(page, OIL_FILL);
  await expect(page.getByTestId("step-title")).toHaveText("Fill with oil and prime the oil system");
  const hold = page.getByTestId("step-hold");
  await expect(hold).toBeInViewport();
  await expect(page.getByTestId("step-blocked")).toContainText(`On hold — waiting for “${CURE}”`);
  await expect(page.getByTestId("step-blocked")).toContainText(why);
  await expect(hold).toContainText("Recording on this step is switched off");
  await acknowledgeCautions(page);
  await expect(page.getByRole("button", { name: "Step done" })).toBeDisabled();
}

test("a running cure is stopped and then cancelled from the bench, each with a reason: the countdown ends, the held step waits as the rules say, and a full run releases it", async ({
  page,
}) => {
  const mechanic = demoUser("mechanic");
  // The tablet's clock starts 40 minutes back, so the full run at the end is stamped in the past
  // (a stamp ahead of the server's clock would be flagged for that alone).
  await page.clock.install({ time: Date.now() - 40 * 60_000 });
  await openJob(page);
  await openStep(page, CASE_BOLTS);
  await expect(page.getByTestId("step-title")).toHaveText("Torque crankcase bolts");
  const panel = page.getByRole("region", { name: `Timer ${CURE}` });

  // Started: counting down, and the oil fill is held while it runs.
  await panel.getByRole("button", { name: "Start: the 30:00 timer" }).click();
  await expect(panel.getByTestId("timer-remaining")).toContainText(/^(30:00|29:5\d)/);
  await expectOilFillHeld(page, /\d?\d:\d\d left/);

  // Stopped with a reason: the countdown is gone, the stop is on screen with its reason; the oil
  // fill still waits (stopped early), and says where to start the timer again.
  await openStep(page, CASE_BOLTS);
  await panel.getByTestId("timer-stop").click();
  await panel.getByLabel("Why (goes on the record)").fill("Wrong sealant tube: cases reopened to clean and reseal");
  await panel.getByRole("button", { name: "Stop the timer" }).click();
  await expect(panel.getByTestId("timer-remaining")).toHaveCount(0);
  await expect(panel.getByTestId("timer-stopped")).toHaveText(
    "■ Stopped before its time: “Wrong sealant tube: cases reopened to clean and reseal”. The step it holds still waits.",
  );
  await page.screenshot({ path: test.info().outputPath("timer-stopped.png") });
  await expectOilFillHeld(page, "its timer was stopped before its time; start it again on step 7, “Torque crankcase bolts”");
  await waitForSynced(page);
  expect(await timerRows()).toEqual([
    {
      started_by: mechanic.email,
      stopped: true,
      stopped_by: mechanic.email,
      stop_reason: "Wrong sealant tube: cases reopened to clean and reseal",
      cancelled: false,
      cancelled_by: null,
      cancel_reason: null,
    },
  ]);

  // Started again, then cancelled with a reason: it stays on screen, marked cancelled, and no longer counts.
  await openStep(page, CASE_BOLTS);
  await panel.getByRole("button", { name: "Start it again: the 30:00 timer" }).click();
  await expect(panel.getByTestId("timer-remaining")).toBeVisible();
  await expect(panel.getByTestId("timer-stopped")).toHaveCount(0);
  await panel.getByTestId("timer-cancel").click();
  await panel.getByLabel("Why (goes on the record)").fill("Started by mistake before the last pass");
  await panel.getByRole("button", { name: "Cancel the timer" }).click();
  await expect(panel.getByTestId("timer-remaining")).toHaveCount(0);
  await expect(panel.getByRole("list", { name: "Cancelled timers" })).toContainText("cancelled: “Started by mistake before the last pass”");
  // The cancelled one no longer counts: the stopped one decides again.
  await expect(panel.getByTestId("timer-stopped")).toBeVisible();
  await page.screenshot({ path: test.info().outputPath("timer-cancelled.png") });
  await expectOilFillHeld(page, "its timer was stopped before its time");
  await waitForSynced(page);
  const [, second] = await timerRows();
  expect(second).toEqual({
    started_by: mechanic.email,
    stopped: false,
    stopped_by: null,
    stop_reason: null,
    cancelled: true,
    cancelled_by: mechanic.email,
    cancel_reason: "Started by mistake before the last pass",
  });

  // A run of its full time releases the oil fill: recording on it is possible again.
  await openStep(page, CASE_BOLTS);
  await panel.getByRole("button", { name: "Start it again: the 30:00 timer" }).click();
  await expect(panel.getByTestId("timer-remaining")).toBeVisible();
  await page.clock.fastForward("30:05");
  await expect(page.getByTestId("timer-alert")).toContainText(`Timer done: ${CURE}`);
  await page.getByRole("button", { name: "OK" }).click();
  await openStep(page, OIL_FILL);
  await expect(page.getByTestId("step-hold")).toHaveCount(0);
  await acknowledgeCautions(page);
  await page.getByRole("button", { name: "Step done" }).click();
  await waitForSynced(page);
  const done = await query<{ flagged: boolean; flag_reason: string | null }>(
    `SELECT c.flagged, c.flag_reason FROM step_completions c JOIN template_steps s ON s.id = c.step_id
     JOIN work_orders w ON w.id = c.work_order_id WHERE w.number = 1021 AND s.key = 'oil-prime'`,
  );
  expect(done).toEqual([{ flagged: false, flag_reason: null }]);
  expect((await timerRows()).map((t) => [t.stopped, t.cancelled])).toEqual([
    [true, false],
    [false, true],
    [false, false],
  ]);
});
