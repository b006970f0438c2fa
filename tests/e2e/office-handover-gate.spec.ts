import { createHash, randomUUID } from "node:crypto";
import { readFile } from "node:fs/promises";
import { expect, test, type Download } from "@playwright/test";
import { PDFParse } from "pdf-parse";
import { formatStamp } from "@/lib/sync/hlc";
import { demoUser, signIn } from "./support/demo-users";
import { query } from "./support/e2e-db";
import { fromOurPage } from "./support/same-origin";

// The gates at the end of a job, in the browser: the demo job #1010 (Felix Amadi's Halden, in review
// with nothing done on the bench) cannot go to Ready: the office sees the checklist of what is open,
// overrides with a written reason, and hands the bike over the same way. The reason is on page one
// of the stored build report, and the customer's link serves that stored file byte for byte.

const sha256 = (b: Buffer) => createHash("sha256").update(b).digest("hex");

async function pdfPage1(bytes: Buffer) {
  const parser = new PDFParse({ data: new Uint8Array(bytes) });
  try {
    return (await parser.getText({ partial: [1] })).text.replace(/\s+/g, " ");
  } finally {
    await parser.destroy();
  }
}

async function bytesOf(download: Download) {
  return readFile((await download.path())!);
}

test("the office cannot hand over an unfinished job without a written reason; the reason is on the stored report", async ({ browser }) => {
  test.setTimeout(120_000);
  const office = await (await browser.newContext()).newPage();
  await signIn(office, "office");
  // opened by its address: the office's list pages, and newer demo jobs push 1010 off its first screen
  const [job] = await query<{ id: string }>("SELECT id FROM work_orders WHERE number = 1010");
  await office.goto(`/office/work-orders/${job.id}`);
  await expect(office.getByTestId("work-order-status")).toContainText("In review");

  // the move to Ready is refused; the checklist lists every open item with a link
  await office.getByRole("button", { name: "→ Ready" }).click();
  await expect(office.getByTestId("form-error")).toBeVisible();
  const checklist = office.getByTestId("open-items");
  await expect(checklist.getByTestId("open-items-summary")).toContainText("cannot move to “Ready”");
  const items = checklist.getByTestId("open-item");
  const openCount = await items.count();
  expect(openCount).toBeGreaterThan(1);
  // stage › step, and the reason in workshop words
  await expect(items.first()).toContainText("Prepare deck and head › Piston deck clearance");
  await expect(items.first()).toContainText("Not done yet: Deck clearance: 4 of 4 readings to record.");
  await expect(items.first().getByTestId("open-item-link")).toHaveAttribute("href", "#build-progress");
  const [{ n }] = await query<{ n: string }>(
    "SELECT count(*) AS n FROM work_order_transitions t JOIN work_orders w ON w.id = t.work_order_id WHERE w.number = 1010",
  );
  expect(Number(n)).toBe(1); // the refused move changed nothing

  // the override: too short a reason is refused in workshop words, then a real one goes through
  const form = office.getByTestId("override-form");
  await form.getByTestId("override-reason").fill("asap");
  await form.getByRole("button", { name: /Move to “Ready” with \d+ items open/ }).click();
  await expect(form.getByTestId("error-override")).toContainText("Reason for the override: write at least 3 words");
  const reason = "Customer collects for a race weekend; head check booked after";
  await form.getByTestId("override-reason").fill(reason);
  await form.getByRole("button", { name: /Move to “Ready” with \d+ items open/ }).click();
  await expect(office.getByTestId("work-order-status")).toContainText("Ready");
  await expect(office.getByTestId("form-ok")).toContainText("Your override and its reason are on record.");

  // handed over: gated the same way, overridden the same way
  await office.getByRole("button", { name: "→ Handed over" }).click();
  await expect(office.getByTestId("override-form")).toBeVisible();
  await office.getByTestId("override-reason").fill(reason);
  await office
    .getByTestId("override-form")
    .getByRole("button", { name: /Move to “Handed over” with \d+ items open/ })
    .click();
  await expect(office.getByTestId("work-order-status")).toContainText("Handed over");
  await expect(office.getByTestId("form-ok")).toContainText("The build report is stored (revision 1).");
  const overrides = office.getByTestId("override");
  await expect(overrides).toHaveCount(2);
  await expect(overrides.first()).toContainText(reason);

  // the override records in PostgreSQL: who, why, what was open
  const recs = await query<{ to_status: string; reason: string; items: number; by: string }>(
    `SELECT o.to_status, o.reason, jsonb_array_length(o.open_items) AS items, u.name AS by
       FROM status_overrides o JOIN work_orders w ON w.id = o.work_order_id JOIN users u ON u.id = o.by_user_id
      WHERE w.number = 1010 ORDER BY o.at`,
  );
  expect(recs.map((r) => [r.to_status, r.reason, r.by])).toEqual([
    ["ready", reason, "Maren Ostby"],
    ["handed_over", reason, "Maren Ostby"],
  ]);
  expect(recs[0].items).toBe(openCount);

  // the stored copy, downloaded by the office: the reason on page one
  const copy = office.getByTestId("report-copy");
  await expect(copy).toHaveCount(1);
  await expect(copy).toContainText("✔ as handed over");
  const [officeDownload] = await Promise.all([office.waitForEvent("download"), copy.getByRole("link", { name: "Revision 1" }).click()]);
  const officeBytes = await bytesOf(officeDownload);
  const page1 = await pdfPage1(officeBytes);
  expect(page1).toContain("Handed over with open items:");
  expect(page1).toContain(reason);
  const [stored] = await query<{ sha256: string; byte_size: number }>(
    "SELECT r.sha256, r.byte_size FROM report_revisions r JOIN work_orders w ON w.id = r.work_order_id WHERE w.number = 1010",
  );
  expect(sha256(officeBytes)).toBe(stored.sha256);
  expect(officeBytes.length).toBe(stored.byte_size);
  await expect(copy).toContainText(stored.sha256);

  // the customer's link serves the stored file: the same bytes
  const customer = await (await browser.newContext()).newPage();
  await signIn(customer, "customer"); // Felix Amadi owns the Halden of job #1010
  const card = customer.getByTestId("my-work-order").filter({ hasText: "#1010" });
  await expect(card.getByTestId("my-report-copy")).toHaveCount(1);
  await expect(card.getByTestId("my-report-copy")).toContainText("the one handed over");
  const [customerDownload] = await Promise.all([
    customer.waitForEvent("download"),
    card.getByTestId("my-report-copy").getByRole("link", { name: "Revision 1 (PDF)" }).click(),
  ]);
  const customerBytes = await bytesOf(customerDownload);
  expect(sha256(customerBytes)).toBe(stored.sha256);
  const [latest] = await Promise.all([customer.waitForEvent("download"), card.getByTestId("my-build-report").click()]);
  expect(sha256(await bytesOf(latest))).toBe(stored.sha256);

  // A tablet that was offline sends two steps done on #1010 after the handover: kept and flagged.
  // Their stage was never signed off, so no review can carry them: the supervisor accepts one on
  // the review page, the office the other on the job's page, each in writing; the last acceptance
  // makes revision 2 of the stored report.
  const mechanic = await (await browser.newContext()).newPage();
  await signIn(mechanic, "mechanic");
  const steps = await query<{ job: string; step: string; title: string; author: string }>(
    `SELECT w.id AS job, s.id AS step, s.title, u.id AS author FROM work_orders w
       JOIN job_procedures jp ON jp.work_order_id = w.id JOIN template_steps s ON s.template_version_id = jp.template_version_id
       JOIN users u ON u.email = $1 WHERE w.number = 1010 ORDER BY jp.position, s.stage_position, s.position LIMIT 2`,
    [demoUser("mechanic").email],
  );
  const now = Date.now();
  const late = steps.map(() => randomUUID());
  const synced = await mechanic.request.post("/api/sync", {
    headers: fromOurPage,
    data: {
      deviceId: "tab-offline-e2e",
      cursor: null,
      operations: steps.map((s, i) => ({
        id: late[i],
        kind: "step.completed",
        workOrderId: s.job,
        authorId: s.author,
        deviceId: "tab-offline-e2e",
        deviceTime: new Date(now).toISOString(),
        stamp: formatStamp({ wallMs: now, counter: i, deviceId: "tab-offline-e2e" }),
        payload: { stepId: s.step },
      })),
    },
  });
  expect((await synced.json()).flagged.map((f: { id: string }) => f.id)).toEqual(late);

  // the supervisor: both are listed under the job on the review page; a short reason is refused, a real one accepts the first
  const supervisor = await (await browser.newContext()).newPage();
  await signIn(supervisor, "supervisor");
  await supervisor.goto("/review");
  const lateJob = supervisor.getByTestId("late-entries-job").filter({ hasText: "#1010" });
  await expect(lateJob.getByTestId("late-entry")).toHaveCount(2);
  const first = lateJob.getByTestId("late-entry").filter({ hasText: steps[0].title });
  await first.getByLabel("Why may it stand?").fill("done");
  await first.getByRole("button", { name: "Accept this entry" }).click();
  await expect(first.getByTestId("form-error")).toBeVisible();
  await first.getByLabel("Why may it stand?").fill("Checked on the bike at collection; the step was done");
  await first.getByRole("button", { name: "Accept this entry" }).click();
  // one still waits: no revision yet
  await expect(supervisor.getByTestId("late-entries").getByTestId("form-ok")).toContainText("#1010: Entry accepted.");
  await expect(lateJob.getByTestId("late-entry")).toHaveCount(1);

  // the office: the other one, on the job's open items
  await office.reload();
  const acceptForm = office.getByTestId("open-item").filter({ hasText: "flagged and not accepted" }).getByTestId("entry-acceptance-form");
  await expect(acceptForm).toHaveCount(1);
  await acceptForm.getByLabel("Why may it stand?").fill("Step finished at the counter before collection; checked it");
  await acceptForm.getByRole("button", { name: "Accept this entry" }).click();
  await expect(office.getByTestId("open-items").getByTestId("form-ok")).toContainText(
    "Entry accepted. The build report is now revision 2.",
  );
  await expect(office.getByTestId("open-item").filter({ hasText: "flagged and not accepted" })).toHaveCount(0);
  await expect(office.getByTestId("report-copy")).toHaveCount(2);
  const accepted = await query<{ decision_id: string | null; justification: string; email: string }>(
    `SELECT a.decision_id, a.justification, u.email FROM flag_acceptances a JOIN users u ON u.id = a.accepted_by
      WHERE a.operation_id = ANY($1::uuid[]) ORDER BY a.accepted_at`,
    [late],
  );
  expect(accepted).toEqual([
    { decision_id: null, justification: "Checked on the bike at collection; the step was done", email: demoUser("supervisor").email },
    { decision_id: null, justification: "Step finished at the counter before collection; checked it", email: demoUser("office").email },
  ]);
  await supervisor.reload();
  await expect(supervisor.getByTestId("late-entries")).toHaveCount(0);
});
