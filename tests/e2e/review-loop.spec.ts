import { readFile } from "node:fs/promises";
import { expect, test, type Page } from "@playwright/test";
import Papa from "papaparse";
import { query } from "./support/e2e-db";
import { typeTag, waitForServiceWorker, waitForSynced } from "./support/bench-pad";
import { demoUser, signIn } from "./support/demo-users";
import { MAIL_WEB } from "./support/fakes";
import { acknowledgeCautions, correctOutOfTolerance, finishStep, openStep, readOpenSpots } from "./support/review-bench";

// The whole loop on demo job #1007 (tag GSW-0007, Tomas Reyes): the first stage done and signed
// off offline, synced, sent back by the supervisor (Dana Kowal), reopened on the tablet with the
// reason, redone, signed off again and approved; the supervisor's e-mail in maildev; the trail on
// the audit page and in its CSV.

const VALUES: Record<string, string> = {
  "Cylinder 1 bore": "76.005",
  "Piston-to-wall, cyl 1": "0.06",
  "Piston-to-wall, cyl 2": "0.061",
  "Top ring gap": "0.41",
  "Top ring gap|Cyl 2": "0.50", // over the 0.48 mm limit
  "Main bearing oil clearance": "0.031",
};
const STAGE = "Measure before assembly";
const REASON = "Top ring gap over the limit: file the ring to size and read the gap again";

/** The e-mail maildev holds for `address` that links to this sign-off (maildev may hold mail from earlier runs). */
async function mailAbout(address: string, signOffId: string) {
  type Mail = { subject: string; text?: string; to: Array<{ address: string }> };
  let found: Mail | undefined;
  await expect
    .poll(
      async () => {
        const all = (await (await fetch(`${MAIL_WEB}/api/email`)).json()) as Mail[];
        found = all.find((m) => m.to.some((t) => t.address === address) && (m.text ?? "").includes(`/review/${signOffId}`));
        return Boolean(found);
      },
      { timeout: 20_000, message: `e-mail to ${address} about sign-off ${signOffId}` },
    )
    .toBe(true);
  return found!;
}

async function reviewCount(page: Page): Promise<number> {
  const badge = page.getByTestId("review-count");
  await expect(badge).toBeVisible();
  return Number((await badge.textContent())!.match(/\d+/)![0]);
}

// Job #1007 is seeded for this test alone: no other test reads on it or starts its timers, so the
// counts below are exact. (On a shared job, another test's cure timer ran out mid-test and its
// banner sat over the step.)
test("offline sign-off → send back with a reason → reopened on the tablet → redo → approve, with e-mail and audit trail", async ({
  browser,
}) => {
  test.setTimeout(300_000);
  const bench = await browser.newContext({ viewport: { width: 1024, height: 768 } });
  const mech = await bench.newPage();
  mech.on("pageerror", (e) => console.log(`[bench page error] ${e.message}`));
  await signIn(mech, "mechanic");
  await waitForServiceWorker(mech);
  await waitForSynced(mech);

  // --- The mechanic works the first stage with the network off and signs it off.
  await bench.setOffline(true);
  await expect(mech.getByTestId("net-state")).toHaveText(/Offline/);
  await typeTag(mech, "GSW-0007");
  await mech.getByRole("button", { name: "Open this bike's job" }).click();
  await expect(mech.getByRole("heading", { name: "Kestrel Sprint 800" })).toBeVisible();
  for (let n = 1; n <= 4; n++) {
    await openStep(mech, n);
    await acknowledgeCautions(mech);
    await readOpenSpots(mech, VALUES);
    await finishStep(mech);
  }
  // none of this job's timers has run out; another test's timer on another of this mechanic's
  // jobs (the tablet keeps them all) may have, and is acknowledged so its banner is out of the way
  const alert = mech.getByTestId("timer-alert");
  await expect(alert.filter({ hasText: "job #1007" })).toHaveCount(0);
  if (await alert.isVisible()) await alert.getByRole("button", { name: "OK" }).click();
  await mech.getByRole("button", { name: "All steps" }).click();
  await mech.getByRole("button", { name: `Sign off “${STAGE}” as Tomas Reyes` }).click();
  await expect(mech.getByTestId("stage-signed").first()).toContainText("(waiting to send)");
  const offlineSignOffs = await query(
    "SELECT count(*)::int AS n FROM sign_offs s JOIN work_orders w ON w.id = s.work_order_id WHERE w.number = 1007",
  );
  expect(offlineSignOffs[0].n).toBe(0);

  await bench.setOffline(false);
  await waitForSynced(mech);
  const [signOff] = await query<{ id: string }>(
    "SELECT s.id FROM sign_offs s JOIN work_orders w ON w.id = s.work_order_id WHERE w.number = 1007 AND s.stage_key = 'measure'",
  );
  expect(signOff).toBeTruthy();

  // --- The supervisor finds it in the queue and sends it back.
  const office = await browser.newContext({ viewport: { width: 1024, height: 768 } });
  const sup = await office.newPage();
  sup.on("pageerror", (e) => console.log(`[review page error] ${e.message}`));
  await signIn(sup, "supervisor");
  await expect(sup).toHaveURL(/\/review$/);
  const row = sup.getByTestId("review-queue").getByRole("row").filter({ hasText: "#1007" });
  await expect(row).toContainText(STAGE);
  await expect(row).toContainText("Tomas Reyes");
  await expect(row.getByTestId("queue-oot")).toContainText("1 reading");
  const before = await reviewCount(sup);

  // The out-of-tolerance filter keeps it; the other way round hides it.
  await sup.getByLabel("Readings").selectOption("no");
  await expect(sup.getByTestId("review-queue").getByRole("row").filter({ hasText: "#1007" })).toHaveCount(0);
  await sup.getByLabel("Readings").selectOption("yes");
  await expect(row).toBeVisible();

  await row.getByRole("link", { name: /Review #1007/ }).click();
  await expect(sup.getByRole("heading", { level: 1 })).toHaveText(STAGE);
  await expect(sup.getByTestId("review-step")).toHaveCount(4);
  const ringStep = sup.getByTestId("review-step").filter({ hasText: "Top ring end gap" });
  await expect(ringStep.getByTestId("reading-row").filter({ hasText: "0.50 mm" })).toContainText("High");
  await expect(sup.getByTestId("oot-reading").filter({ hasText: "Top ring gap, Cyl 2" })).toContainText("0.50 mm");

  // Approving with a reading out of tolerance and no written reason is refused beside the reading.
  await sup.getByRole("radio", { name: "✔ Approve" }).check();
  await sup.getByRole("button", { name: `Approve “${STAGE}”` }).click();
  await expect(sup.getByTestId("error-reading").first()).toContainText("let it stand with a written reason");

  await sup.getByRole("radio", { name: "↺ Send back" }).check();
  // By default the step with the reading out of tolerance is the one to reopen.
  const stepsToReopen = sup.getByRole("group", { name: "Steps to reopen" });
  await expect(stepsToReopen.getByRole("checkbox", { name: /Top ring end gap/ })).toBeChecked();
  await expect(stepsToReopen.getByRole("checkbox", { name: /Bore gauge cylinder 1/ })).not.toBeChecked();
  await sup.getByRole("button", { name: "Send back to the bench" }).click();
  await expect(sup.getByTestId("error-reason")).toContainText("Say why it goes back");
  await sup.getByLabel("Why it goes back (the mechanic sees this on the step)").fill(REASON);
  await sup.getByRole("button", { name: "Send back to the bench" }).click();
  await expect(sup.getByTestId("form-ok")).toContainText("Sent back. 1 step reopens on the mechanic's tablet at its next sync.");
  await expect(sup.getByTestId("standing-decision")).toContainText(REASON);
  await expect.poll(() => reviewCount(sup)).toBe(before - 1);

  // The supervisor's e-mail about the readings out of tolerance, captured by maildev.
  const mail = await mailAbout(demoUser("supervisor").email, signOff.id);
  expect(mail.subject).toMatch(/^Work order 1007: "Measure before assembly" signed off with 1 reading out of tolerance$/);
  expect(mail.text).toContain("Top ring gap, Cyl 2: 0.50 mm (high; limits 0.35–0.48 mm)");
  expect(mail.text).toContain("Tomas Reyes signed off");

  // --- The tablet gets the send-back at its next sync: exactly that step reopens, with the reason.
  await mech.getByRole("button", { name: "Sync now" }).click();
  await waitForSynced(mech);
  const reopened = mech.getByRole("button", { name: /Top ring end gap/ });
  await expect(reopened).toContainText("Reopened — redo");
  await expect(mech.getByRole("button", { name: /Bore gauge cylinder 1/ })).toContainText("Done");
  await expect(mech.getByRole("region", { name: `Stage ${STAGE}` })).toContainText(`Sent back by the supervisor: ${REASON}`);
  await reopened.click();
  await expect(mech.getByTestId("reopened-reason")).toHaveText(`↺ Sent back by the supervisor: ${REASON}`);
  await acknowledgeCautions(mech);
  expect(await correctOutOfTolerance(mech, "0.44")).toEqual(["Top ring gap Cyl 2"]);
  await finishStep(mech);
  await mech.getByRole("button", { name: "All steps" }).click();
  await mech.getByRole("button", { name: `Sign off “${STAGE}” as Tomas Reyes` }).click();
  await waitForSynced(mech);

  // --- The new sign-off is back in the queue, marked as coming after a send-back; approve it.
  await sup.goto("/review");
  const again = sup.getByTestId("review-queue").getByRole("row").filter({ hasText: "#1007" });
  await expect(again).toContainText("after a send-back");
  await expect(again).toContainText("none");
  await again.getByRole("link", { name: /Review #1007/ }).click();
  await expect(sup.getByText("Earlier sign-offs of this stage (1)")).toBeVisible();
  await expect(sup.getByTestId("review-step").filter({ hasText: "Top ring end gap" })).toContainText(
    `Sent back once — latest: “${REASON}”`,
  );
  // The corrected spot now counts; the reading it replaced stays on record.
  const corrected = sup
    .getByTestId("review-step")
    .filter({ hasText: "Top ring end gap" })
    .getByTestId("reading-row")
    .filter({ hasText: "0.44 mm" });
  await expect(corrected).toHaveCount(1);
  await expect(corrected).toContainText("current");
  await expect(
    sup.getByTestId("review-step").filter({ hasText: "Top ring end gap" }).getByTestId("reading-row").filter({ hasText: "0.50 mm" }),
  ).toContainText("replaced by a correction");
  await sup.getByRole("radio", { name: "✔ Approve" }).check();
  await sup.getByRole("button", { name: `Approve “${STAGE}”` }).click();
  await expect(sup.getByTestId("form-ok")).toContainText("Approved");
  await expect(sup.getByTestId("standing-decision")).toContainText("Approved by Dana Kowal");

  const decisions = await query<{ decision: string; reason: string; reopened: string[] }>(
    `SELECT d.decision, d.reason, d.reopened_step_ids::text[] AS reopened FROM review_decisions d JOIN sign_offs s ON s.id = d.sign_off_id
     JOIN work_orders w ON w.id = s.work_order_id WHERE w.number = 1007 ORDER BY d.change_seq`,
  );
  const [ringGap] = await query<{ id: string }>(
    "SELECT ts.id FROM template_steps ts JOIN job_procedures jp ON jp.template_version_id = ts.template_version_id JOIN work_orders w ON w.id = jp.work_order_id WHERE w.number = 1007 AND ts.key = 'ring-gap'",
  );
  expect(decisions).toEqual([
    { decision: "sent_back", reason: REASON, reopened: [ringGap.id] },
    { decision: "approved", reason: "", reopened: [] },
  ]);

  // --- The mechanic's tablet shows the approval; the audit page shows the trail.
  await mech.getByRole("button", { name: "Sync now" }).click();
  await waitForSynced(mech);
  await expect(mech.getByRole("region", { name: `Stage ${STAGE}` })).toContainText("Approved by the supervisor");

  await sup.getByRole("link", { name: "Audit trail of job #1007" }).click();
  await expect(sup).toHaveURL(/\/audit\?job=1007$/);
  const audit = sup.getByTestId("audit-table");
  await expect(audit.getByRole("row").filter({ hasText: "review.approve" }).first()).toContainText("Dana Kowal");
  await expect(audit.getByRole("row").filter({ hasText: "review.send-back" }).filter({ hasText: "accepted" })).toContainText(REASON);
  await expect(audit.getByRole("row").filter({ hasText: "review.send-back" }).filter({ hasText: "refused" })).toHaveCount(0);
  await expect(audit.getByRole("row").filter({ hasText: "sync.stage.signed-off" })).toHaveCount(2);
  await expect(audit.getByRole("row").filter({ hasText: "review.notice-mail" }).first()).toContainText("accepted");

  const [download] = await Promise.all([sup.waitForEvent("download"), sup.getByTestId("audit-export").click()]);
  expect(download.suggestedFilename()).toMatch(/^audit-log-job-1007-\d{4}-\d\d-\d\d-to-\d{4}-\d\d-\d\d\.csv$/);
  const csv = Papa.parse<Record<string, string>>(await readFile(await download.path(), "utf8"), { header: true, skipEmptyLines: true });
  const sendBack = csv.data.find((r) => r.action === "review.send-back" && r.outcome === "accepted");
  expect(sendBack).toMatchObject({
    work_order: "1007",
    actor_email: demoUser("supervisor").email,
    actor_role: "supervisor",
    reason: REASON,
    entity_id: signOff.id,
  });
  expect(csv.data.filter((r) => r.action === "sync.stage.signed-off").map((r) => r.actor_name)).toEqual(["Tomas Reyes", "Tomas Reyes"]);
  expect(csv.data.every((r) => r.work_order === "1007")).toBe(true);

  // --- The office sees the stage approved on the work order's build progress.
  const desk = await browser.newContext({ viewport: { width: 768, height: 1024 } });
  const officePage = await desk.newPage();
  await signIn(officePage, "office");
  const [job] = await query<{ id: string }>("SELECT id FROM work_orders WHERE number = 1007");
  await officePage.goto(`/office/work-orders/${job.id}`);
  const progress = officePage.getByTestId("build-progress");
  const measured = progress.getByTestId("progress-stage").filter({ hasText: STAGE });
  await expect(measured).toContainText("✔ Approved");
  await expect(measured).toContainText("4/4");
  await expect(measured).toContainText("none");
  await expect(progress.getByTestId("progress-summary")).toContainText(
    /^4 of \d+ steps done · 1 of \d+ stages approved · no readings out of tolerance$/,
  );
  await expect(progress.getByTestId("progress-due")).toHaveCount(0);
  await officePage.screenshot({ path: test.info().outputPath("office-build-progress.png"), fullPage: true });

  await bench.close();
  await office.close();
  await desk.close();
});
