import "server-only";
import { sql, type Kysely, type Transaction } from "kysely";
import type { SessionUser } from "@/lib/auth/session-user";
import { addDays, dayIn, dayLabel, dueDateProblem, reminderMail, reminderState, type NewReminderInput } from "@/lib/aftercare/reminders";
import { Refusal } from "@/lib/errors";
import { appendAudit } from "../audit/append";
import type { QueuedMail } from "../mail/outbox";
import type { Database } from "../schema";

// Reminders after handover (run-in check, first service): set at handover from the run-in lines of
// the templates the job ran, or added by the office; e-mailed on their day through the queue; done
// when the office records it.

type Trx = Transaction<Database>;
type Db = Kysely<Database> | Trx;

async function shopDay(db: Db, shopId: string, at?: Date): Promise<{ today: string; timeZone: string; shopName: string }> {
  const s = await db.selectFrom("shops").select(["time_zone as timeZone", "name"]).where("id", "=", shopId).executeTakeFirstOrThrow();
  return { today: dayIn(s.timeZone, at), timeZone: s.timeZone, shopName: s.name };
}

/**
 * At handover (inside its transaction): one reminder per run-in line of the templates the work
 * order ran, due so many days after today and at so many km after the intake odometer. Once per
 * line (unique work order + line), so a repeated handover makes none twice.
 */
export async function setRemindersAtHandover(trx: Trx, shopId: string, userId: string, workOrderId: string): Promise<number> {
  const { today } = await shopDay(trx, shopId);
  const wo = await trx.selectFrom("work_orders").select("intake_odometer_km as km").where("id", "=", workOrderId).executeTakeFirstOrThrow();
  const lines = await trx
    .selectFrom("job_procedures as jp")
    .innerJoin("template_versions as v", "v.id", "jp.template_version_id")
    .innerJoin("run_in_reminder_lines as l", "l.template_id", "v.template_id")
    .select(["l.id", "l.label", "l.after_days as afterDays", "l.after_km as afterKm"])
    .where("jp.work_order_id", "=", workOrderId)
    .where("l.shop_id", "=", shopId)
    .orderBy("jp.position")
    .orderBy("l.position")
    .execute();
  if (!lines.length) return 0;
  const made = await trx
    .insertInto("service_reminders")
    .values(
      lines.map((l) => ({
        shop_id: shopId,
        work_order_id: workOrderId,
        label: l.label,
        due_on: addDays(today, l.afterDays),
        due_odometer_km: l.afterKm !== null && wo.km !== null ? wo.km + l.afterKm : null,
        from_line_id: l.id,
        created_by: userId,
      })),
    )
    .onConflict((oc) => oc.columns(["work_order_id", "from_line_id"]).doNothing())
    .returning("id")
    .execute();
  return made.length;
}

/** A reminder the office adds to a handed-over work order; a day in the past is refused with the reason. */
export async function addReminder(db: Kysely<Database>, user: SessionUser, workOrderId: string, input: NewReminderInput) {
  const wo = await db
    .selectFrom("work_orders")
    .select(["id", "number", "status"])
    .where("id", "=", workOrderId)
    .where("shop_id", "=", user.shopId)
    .executeTakeFirst();
  if (!wo) throw new Refusal("No such work order in this shop.", 404);
  if (wo.status !== "handed_over")
    throw new Refusal(`Job #${wo.number} is not handed over yet: reminders start at handover.`, 409, [
      { path: "dueOn", message: "not handed over" },
    ]);
  const { today } = await shopDay(db, user.shopId);
  const problem = dueDateProblem(input.dueOn, today);
  if (problem) throw new Refusal(problem, 422, [{ path: "dueOn", message: problem }]);
  return db.transaction().execute(async (trx) => {
    const row = await trx
      .insertInto("service_reminders")
      .values({
        shop_id: user.shopId,
        work_order_id: workOrderId,
        label: input.label,
        due_on: input.dueOn,
        due_odometer_km: input.dueOdometerKm ?? null,
        from_line_id: null,
        created_by: user.id,
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    await appendAudit(trx, [
      {
        shopId: user.shopId,
        actorId: user.id,
        action: "reminder.add",
        entity: "service_reminder",
        entityId: row.id,
        workOrderId,
        outcome: "accepted",
        detail: { label: input.label, dueOn: input.dueOn },
      },
    ]);
    return row;
  });
}

/** Records that a reminder's check or service was done (once; a second record is refused naming the first). */
export async function markReminderDone(
  db: Kysely<Database>,
  user: SessionUser,
  reminderId: string,
  input: { note: string; odometerKm?: number | null },
) {
  return db.transaction().execute(async (trx) => {
    const r = await trx
      .selectFrom("service_reminders")
      .select(["id", "work_order_id as workOrderId", "label"])
      .where("id", "=", reminderId)
      .where("shop_id", "=", user.shopId)
      .forUpdate()
      .executeTakeFirst();
    if (!r) throw new Refusal("No such reminder in this shop.", 404);
    const done = await trx
      .selectFrom("service_reminder_done as d")
      .innerJoin("users as u", "u.id", "d.recorded_by")
      .select(["u.name", "d.recorded_at as at"])
      .where("d.reminder_id", "=", reminderId)
      .executeTakeFirst();
    if (done) {
      const { timeZone } = await shopDay(trx, user.shopId, done.at);
      throw new Refusal(`${r.label} was already recorded as done by ${done.name} on ${dayLabel(dayIn(timeZone, done.at))}.`, 409);
    }
    const row = await trx
      .insertInto("service_reminder_done")
      .values({
        shop_id: user.shopId,
        reminder_id: reminderId,
        note: input.note,
        odometer_km: input.odometerKm ?? null,
        recorded_by: user.id,
      })
      .returning(["id", "recorded_at as recordedAt"])
      .executeTakeFirstOrThrow();
    await appendAudit(trx, [
      {
        shopId: user.shopId,
        actorId: user.id,
        action: "reminder.done",
        entity: "service_reminder",
        entityId: reminderId,
        workOrderId: r.workOrderId,
        outcome: "accepted",
        detail: { odometerKm: input.odometerKm ?? null },
      },
    ]);
    return row;
  });
}

/** Reminders (`r`) with their work order (`w`), bike (`b`) and the bike's owner (`c`). */
function remindersWithBike(db: Kysely<Database>) {
  return db
    .selectFrom("service_reminders as r")
    .innerJoin("work_orders as w", "w.id", "r.work_order_id")
    .innerJoin("bikes as b", "b.id", "w.bike_id")
    .innerJoin("customers as c", "c.id", "b.customer_id");
}

/**
 * The shop's reminders not done (and those done in the last 30 days), or every reminder of one
 * work order, with where each stands today.
 */
export async function listReminders(db: Kysely<Database>, shopId: string, o: { at?: Date; workOrderId?: string } = {}) {
  const at = o.at;
  const { today } = await shopDay(db, shopId, at);
  const rows = await remindersWithBike(db)
    .leftJoin("service_reminder_done as d", "d.reminder_id", "r.id")
    .leftJoin("users as du", "du.id", "d.recorded_by")
    .leftJoin("mail_outbox as m", (j) => j.on("m.shop_id", "=", shopId).on("m.cause", "=", sql<string>`'reminder:' || r.id`))
    .select([
      "r.id",
      "r.label",
      sql<string>`r.due_on::text`.as("dueOn"),
      "r.due_odometer_km as dueOdometerKm",
      "w.id as workOrderId",
      "w.number",
      "b.tag_code as tagCode",
      "b.make",
      "b.model",
      "c.name as customerName",
      "c.email as customerEmail",
      "d.recorded_at as doneAt",
      "du.name as doneBy",
      "d.note as doneNote",
      "m.state as mailState",
      "m.sent_at as mailedAt",
    ])
    .where("r.shop_id", "=", shopId)
    .$if(Boolean(o.workOrderId), (q) => q.where("r.work_order_id", "=", o.workOrderId!))
    .$if(!o.workOrderId, (q) =>
      q.where((eb) => eb.or([eb("d.id", "is", null), eb("d.recorded_at", ">", sql<Date>`now() - interval '30 days'`)])),
    )
    .orderBy("r.due_on")
    .orderBy("w.number")
    .execute();
  return { today, rows: rows.map((r) => ({ ...r, state: reminderState(r.dueOn, today, r.doneAt !== null) })) };
}
export type ReminderRow = Awaited<ReturnType<typeof listReminders>>["rows"][number];

/**
 * The e-mails of reminders that have come due (on or before today, not done, customer with an
 * e-mail address), for the queue. The outbox keeps one e-mail per cause "reminder:<id>", so two
 * workers handing the same reminder on make one e-mail.
 */
export async function dueReminderMails(db: Kysely<Database>, at?: Date): Promise<QueuedMail[]> {
  const rows = await remindersWithBike(db)
    .innerJoin("shops as s", "s.id", "r.shop_id")
    .select([
      "r.id",
      "r.shop_id as shopId",
      "r.label",
      sql<string>`r.due_on::text`.as("dueOn"),
      "r.due_odometer_km as dueOdometerKm",
      "s.time_zone as timeZone",
      "s.name as shopName",
      "w.id as workOrderId",
      "w.number",
      "b.tag_code as tagCode",
      "b.make",
      "b.model",
      "c.name as customerName",
      "c.email",
    ])
    // the latest "today" of any zone (UTC+14) bounds the query; each shop's own day is checked below
    .where("r.due_on", "<=", dayIn("Pacific/Kiritimati", at))
    .where(({ not, exists, selectFrom }) =>
      not(exists(selectFrom("service_reminder_done as d").select("d.id").whereRef("d.reminder_id", "=", "r.id"))),
    )
    .where(({ not, exists, selectFrom }) =>
      not(
        exists(
          selectFrom("mail_outbox as m")
            .select("m.id")
            .whereRef("m.shop_id", "=", "r.shop_id")
            .where("m.cause", "=", sql<string>`'reminder:' || r.id`),
        ),
      ),
    )
    .where("c.email", "is not", null)
    .limit(500)
    .execute();
  return rows
    .filter((r) => r.dueOn <= dayIn(r.timeZone, at) && r.email)
    .map((r) => {
      const m = reminderMail({ ...r, workOrderNumber: r.number });
      return { shopId: r.shopId, workOrderId: r.workOrderId, kind: "service_reminder", cause: `reminder:${r.id}`, to: r.email!, ...m };
    });
}
