import { describe, expect, it } from "vitest";
import { storeHandoverCopy } from "@/app/_server/frozen-report";
import { QUEUES } from "@/app/_server/queue/names";
import { queueDueReminders } from "@/app/_server/reminder-mail";
import { POST as doneRoute } from "@/app/api/office/reminders/[id]/done/route";
import { POST as addRoute } from "@/app/api/office/work-orders/[id]/reminders/route";
import { dueReminderMails, listReminders } from "@/db/aftercare/reminders";
import { handOver } from "@/db/office/invoices";
import { moveWorkOrder } from "@/db/shop/work-orders";
import { addDays, dayIn } from "@/lib/aftercare/reminders";
import type { SessionUser } from "@/lib/auth/session-user";
import { closeOutJob, finishEverything } from "./support/close-out";
import { mailTo, useFakes } from "./support/fakes";
import { eventually, useQueueWorkers } from "./support/queue";
import { appRequest } from "./support/route-calls";
import { useTestDb } from "./support/test-db";

// Reminders on real PostgreSQL: set at handover from the template's run-in lines, e-mailed once
// when due (two queue workers, as two app instances, and the fake SMTP), the office's rules.

const db = useTestDb();
const ports = useFakes();
const workers = useQueueWorkers(db, 2);

/** A close-out job whose template carries run-in lines (tomorrow; 30 days or 800 km), handed over today. */
async function handedOverWithLines() {
  const job = await closeOutJob(db);
  await db.updateTable("work_orders").set({ status: "cancelled", closed_at: new Date() }).where("id", "=", job.fx.workOrderId).execute();
  const tpl = await db
    .selectFrom("job_procedures as jp")
    .innerJoin("template_versions as v", "v.id", "jp.template_version_id")
    .select("v.template_id as id")
    .where("jp.work_order_id", "=", job.workOrderId)
    .executeTakeFirstOrThrow();
  await db
    .insertInto("run_in_reminder_lines")
    .values([
      { shop_id: job.fx.shopId, template_id: tpl.id, position: 0, label: "Run-in check", after_days: 1, after_km: null },
      { shop_id: job.fx.shopId, template_id: tpl.id, position: 1, label: "First service", after_days: 30, after_km: 800 },
    ])
    .execute();
  await finishEverything(db, job);
  await moveWorkOrder(db, job.fx.shopId, job.users.office.id, job.workOrderId, "ready");
  const done = await handOver(db, job.fx.shopId, job.users.office.id, job.workOrderId, {
    storeReport: (trx) => storeHandoverCopy(trx, job.fx.shopId, job.workOrderId, job.users.office.id),
  });
  expect(done.reminders).toBe(2);
  const customer = await db.selectFrom("customers").select("email").where("id", "=", job.fx.customerId).executeTakeFirstOrThrow();
  return { job, email: customer.email! };
}

const reminders = (workOrderId: string) =>
  db
    .selectFrom("service_reminders")
    .select(["id", "label", (eb) => eb.cast<string>("due_on", "text").as("dueOn"), "due_odometer_km as km"])
    .where("work_order_id", "=", workOrderId)
    .orderBy("due_on")
    .execute();
const post = (url: string, body: unknown) =>
  appRequest(url, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(body) });
const add = (user: SessionUser, id: string, body: unknown) =>
  addRoute.handle(post(`/api/office/work-orders/${id}/reminders`, body), { user, db, params: { id } });
const done = (user: SessionUser, id: string, body: unknown) =>
  doneRoute.handle(post(`/api/office/reminders/${id}/done`, body), { user, db, params: { id } });

describe("reminders set at handover", () => {
  it("one per run-in line of the job's templates: due so many days after handover, at so many km after the intake odometer", async () => {
    const { job } = await handedOverWithLines();
    const today = dayIn("UTC");
    expect((await reminders(job.workOrderId)).map((r) => [r.label, r.dueOn, r.km])).toEqual([
      ["Run-in check", addDays(today, 1), null],
      ["First service", addDays(today, 30), 1200 + 800],
    ]);
    const list = await listReminders(db, job.fx.shopId, { workOrderId: job.workOrderId });
    expect(list.rows.map((r) => r.state)).toEqual(["due", "coming"]);
    await expect(db.deleteFrom("service_reminders").where("work_order_id", "=", job.workOrderId).execute()).rejects.toThrow(/append-only/);
  });
});

describe("a reminder due tomorrow", () => {
  it("is not sent today, and is sent exactly once tomorrow by two queue workers each running the reminders job", async () => {
    const { job, email } = await handedOverWithLines();
    const [tomorrow] = await reminders(job.workOrderId);
    const cause = `reminder:${tomorrow.id}`;
    const outbox = () => db.selectFrom("mail_outbox").select(["state", "subject"]).where("cause", "=", cause).execute();

    // today: both workers run the job; nothing of this job is due
    await Promise.all(workers.map((w) => w.send(QUEUES.reminders, {})));
    await new Promise((r) => setTimeout(r, 2500));
    expect(await outbox()).toEqual([]);
    expect((await dueReminderMails(db)).filter((m) => m.cause === cause)).toEqual([]);

    // tomorrow: the scheduled job lands on both instances at once, and is run directly twice more
    const asOf = new Date(Date.now() + 86_400_000 + 60_000).toISOString();
    await Promise.all([
      ...workers.map((w) => w.send(QUEUES.reminders, { asOf })),
      queueDueReminders(db, workers[0], asOf),
      queueDueReminders(db, workers[1], asOf),
    ]);
    await eventually(async () => (await outbox()).some((m) => m.state === "sent"));
    expect(await outbox()).toEqual([{ state: "sent", subject: "Run-in check due for your Fixture Test 1000" }]);
    const got = await mailTo(ports.mailWeb, email, 2, 2500);
    expect(got.map((m) => m.subject)).toEqual(["Run-in check due for your Fixture Test 1000"]);
    expect(got[0].text).toContain(`tag ${job.fx.bike.tag_code}, our job #2`);
    // the 30-day reminder is not due tomorrow
    const later = (await reminders(job.workOrderId))[1];
    expect(await db.selectFrom("mail_outbox").select("id").where("cause", "=", `reminder:${later.id}`).execute()).toEqual([]);
  });

  it("is not sent once the office has recorded it done", async () => {
    const { job } = await handedOverWithLines();
    const [tomorrow] = await reminders(job.workOrderId);
    expect((await done(job.users.office, tomorrow.id, { note: "Came in early for it." })).status).toBe(201);
    const asOf = new Date(Date.now() + 86_400_000 + 60_000);
    expect((await dueReminderMails(db, asOf)).filter((m) => m.cause === `reminder:${tomorrow.id}`)).toEqual([]);
  });
});

describe("the office's reminder rules", () => {
  it("refuses a day in the past, a day that does not exist, a job not handed over, a blank or NUL label; nothing is saved", async () => {
    const { job } = await handedOverWithLines();
    const today = dayIn("UTC");
    const before = (await reminders(job.workOrderId)).length;
    const past = await add(job.users.office, job.workOrderId, { label: "Chain check", dueOn: addDays(today, -1) });
    expect(past.status).toBe(422);
    expect((await past.json()).error).toMatch(/^Due date .+ is in the past: a reminder must be due today \(.+\) or later\.$/);
    const cases: Array<[unknown, string]> = [
      [{ label: "Chain check", dueOn: "2026-02-30" }, "Due date must be a real day between the years 2000 and 2099."],
      [{ label: "Chain check", dueOn: "0000-01-01" }, "Due date must be a real day between the years 2000 and 2099."],
      [{ label: " ", dueOn: addDays(today, 3) }, "Say what the reminder is for (e.g. run-in check)."],
      [{ label: "Chain\u0000check", dueOn: addDays(today, 3) }, "Reminder holds a NUL character"],
      [{ label: "Chain check", dueOn: addDays(today, 3), dueOdometerKm: "1e400" }, "Due at (km) must be a whole number of km."],
    ];
    for (const [body, message] of cases) {
      const r = await add(job.users.office, job.workOrderId, body);
      expect(r.status).toBe(400);
      expect(JSON.stringify(await r.json())).toContain(message);
    }
    const notYet = await closeOutJob(db);
    const r = await add(notYet.users.office, notYet.workOrderId, { label: "Chain check", dueOn: addDays(today, 3) });
    expect(r.status).toBe(409);
    expect((await r.json()).error).toBe("Job #2 is not handed over yet: reminders start at handover.");
    expect((await add(job.users.mech, job.workOrderId, { label: "Chain check", dueOn: addDays(today, 3) })).status).toBe(403);
    expect(await reminders(job.workOrderId)).toHaveLength(before);

    const ok = await add(job.users.office, job.workOrderId, { label: "Chain check", dueOn: today, dueOdometerKm: 2500 });
    expect(ok.status).toBe(201);
    expect(await reminders(job.workOrderId)).toHaveLength(before + 1);
  });

  it("records done once, with who and when; a second record is refused naming the first", async () => {
    const { job } = await handedOverWithLines();
    const [r] = await reminders(job.workOrderId);
    expect((await done(job.users.office, r.id, { note: "", odometerKm: 1650 })).status).toBe(201);
    const again = await done(job.users.office, r.id, { note: "twice" });
    expect(again.status).toBe(409);
    expect((await again.json()).error).toMatch(/^Run-in check was already recorded as done by office .+ on .+\.$/);
    const row = await db.selectFrom("service_reminder_done").selectAll().where("reminder_id", "=", r.id).executeTakeFirstOrThrow();
    expect(row).toMatchObject({ recorded_by: job.users.office.id, odometer_km: 1650, note: "" });
    const list = await listReminders(db, job.fx.shopId, { workOrderId: job.workOrderId });
    expect(list.rows[0]).toMatchObject({ state: "done", doneBy: expect.stringContaining("office") });
  });
});
