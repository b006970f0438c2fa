import "server-only";
import { sql, type Kysely } from "kysely";
import { clockCloseSchema, closeRefusal, type ClockCloseInput } from "@/lib/clock/close";
import { quotedLabourHundredths, spanMinutes, summariseHours, type HoursSummary } from "@/lib/clock/hours";
import { clockSpans, recordsOfJobClocks, type ClockRecord, type ClockSpan } from "@/lib/clock/spans";
import { Refusal } from "@/lib/errors";
import type { ClockSnapshot } from "@/lib/sync/snapshot";
import { appendAudit } from "../audit/append";
import type { Database } from "../schema";

// Time at the bench, read and closed: the clocks of a job (with every record that ends them), the
// hours per stage and per person against the quoted labour, and a supervisor's close of a clock
// left running (an append-only closing record, under the shop's sync lock).

/** The clocks on a job with their ends, oldest first (the bench snapshot's `clocks`). */
export async function clocksOfJob(db: Kysely<Database>, jobId: string): Promise<ClockSnapshot[]> {
  const [clocks, ends] = await Promise.all([
    db
      .selectFrom("bench_clocks")
      .select(["id", "mechanic_id", "job_procedure_id", "stage_key", "started_at", "operation_id"])
      .where("work_order_id", "=", jobId)
      .orderBy("started_at")
      .orderBy("id")
      .execute(),
    db
      .selectFrom("bench_clock_ends")
      .select(["clock_id", "kind", "ended_at", "recorded_by", "reason", "operation_id"])
      .where("work_order_id", "=", jobId)
      .orderBy("recorded_at")
      .orderBy("id")
      .execute(),
  ]);
  return clocks.map((c) => ({
    id: c.id,
    mechanicId: c.mechanic_id,
    jobProcedureId: c.job_procedure_id,
    stageKey: c.stage_key,
    startedAt: c.started_at.toISOString(),
    operationId: c.operation_id,
    ends: ends
      .filter((e) => e.clock_id === c.id)
      .map((e) => ({
        kind: e.kind,
        endedAt: e.ended_at.toISOString(),
        recordedBy: e.recorded_by,
        reason: e.reason,
        operationId: e.operation_id,
      })),
  }));
}

/** The spans of a job's clocks: each ended by its own records or by its mechanic's next clock-on, on any job. */
async function jobSpans(db: Kysely<Database>, jobId: string, nowMs: number): Promise<ClockSpan[]> {
  const mine = await clocksOfJob(db, jobId);
  if (!mine.length) return [];
  const { clocks: records, ends } = recordsOfJobClocks(jobId, mine);
  const earliest = new Date(Math.min(...records.map((r) => r.startedAtMs)));
  // the same mechanics' clock-ons on other jobs end a clock here that was left running
  const elsewhere = await db
    .selectFrom("bench_clocks")
    .select(["id", "mechanic_id", "work_order_id", "job_procedure_id", "stage_key", "started_at"])
    .where("mechanic_id", "=", sql<string>`ANY(${[...new Set(records.map((r) => r.mechanicId))]}::uuid[])`)
    .where("work_order_id", "<>", jobId)
    .where("started_at", ">=", earliest)
    .execute();
  const others: ClockRecord[] = elsewhere.map((c) => ({
    id: c.id,
    mechanicId: c.mechanic_id,
    workOrderId: c.work_order_id,
    jobProcedureId: c.job_procedure_id,
    stageKey: c.stage_key,
    startedAtMs: c.started_at.getTime(),
  }));
  return clockSpans(records, ends, nowMs, [...records, ...others]);
}

export interface JobHours extends HoursSummary {
  spans: Array<ClockSpan & { mechanicName: string; stageTitle: string | null }>;
  /** Names for the per-stage and per-person lines. */
  stageTitles: Record<string, string>;
  people: Record<string, string>;
  /** The quote the labour comes from: the approved one, else the latest sent. */
  quoteVersion: number | null;
}

/** The hours on a job of the shop (null: no such job), per stage and person, against the quote's labour lines. */
export async function hoursOfJob(db: Kysely<Database>, shopId: string, jobId: string, nowMs = Date.now()): Promise<JobHours | null> {
  const job = await db.selectFrom("work_orders").select("id").where("id", "=", jobId).where("shop_id", "=", shopId).executeTakeFirst();
  if (!job) return null;
  const [spans, quote, stages] = await Promise.all([
    jobSpans(db, jobId, nowMs),
    db
      .selectFrom("quotes")
      .select(["id", "version"])
      .where("work_order_id", "=", jobId)
      .where("status", "in", ["approved", "sent"])
      .orderBy(sql`CASE WHEN status = 'approved' THEN 0 ELSE 1 END`)
      .orderBy("version", "desc")
      .executeTakeFirst(),
    db
      .selectFrom("job_procedures as jp")
      .innerJoin("template_steps as s", "s.template_version_id", "jp.template_version_id")
      .select(["jp.id as job_procedure_id", "s.stage_key as key", "s.stage_title as title"])
      .distinct()
      .where("jp.work_order_id", "=", jobId)
      .execute(),
  ]);
  const lines = quote
    ? await db.selectFrom("quote_lines").select(["kind", "quantity_hundredths"]).where("quote_id", "=", quote.id).execute()
    : [];
  const mechanicIds = [...new Set(spans.map((s) => s.mechanicId))];
  const users = mechanicIds.length
    ? await db
        .selectFrom("users")
        .select(["id", "name"])
        .where("id", "=", sql<string>`ANY(${mechanicIds}::uuid[])`)
        .execute()
    : [];
  const people = Object.fromEntries(users.map((u) => [u.id, u.name]));
  const stageTitles = Object.fromEntries(stages.map((s) => [`${s.job_procedure_id}|${s.key}`, s.title]));
  const summary = summariseHours(
    spans,
    quote ? quotedLabourHundredths(lines.map((l) => ({ kind: l.kind, quantityHundredths: l.quantity_hundredths }))) : null,
  );
  return {
    ...summary,
    spans: spans.map((s) => ({
      ...s,
      mechanicName: people[s.mechanicId] ?? "Someone",
      stageTitle: s.jobProcedureId && s.stageKey ? (stageTitles[`${s.jobProcedureId}|${s.stageKey}`] ?? s.stageKey) : null,
    })),
    stageTitles,
    people,
    quoteVersion: quote?.version ?? null,
  };
}

/**
 * A supervisor closes a clock left running, saying when it ended and why: one closing record
 * (who, when, why) and an audit entry. Refused when the clock is not running (already ended), or
 * the end is before the clock-on or in the future. Runs under the shop's sync lock, so a merge
 * bringing a clock-off and this close are decided one after the other.
 */
export async function closeForgottenClock(
  db: Kysely<Database>,
  user: { id: string; shopId: string },
  clockId: string,
  input: ClockCloseInput,
  nowMs = Date.now(),
): Promise<{ clockId: string; endedAt: string }> {
  const d = clockCloseSchema.parse(input);
  return db.transaction().execute(async (trx) => {
    await sql`SELECT benchtag_lock_shop_sync(${user.shopId}::uuid)`.execute(trx);
    const clock = await trx
      .selectFrom("bench_clocks")
      .select(["id", "work_order_id"])
      .where("id", "=", clockId)
      .where("shop_id", "=", user.shopId)
      .executeTakeFirst();
    if (!clock) throw new Refusal("No such clock in this shop.", 404);
    const spans = await jobSpans(trx as unknown as Kysely<Database>, clock.work_order_id, nowMs);
    const span = spans.find((s) => s.id === clockId)!;
    const endedAtMs = Date.parse(d.endedAt);
    const refusal = closeRefusal(span, endedAtMs, nowMs);
    if (refusal) throw new Refusal(refusal, 409, [{ path: "endedAt", message: refusal }]);
    await trx
      .insertInto("bench_clock_ends")
      .values({
        clock_id: clockId,
        work_order_id: clock.work_order_id,
        kind: "closed-by-supervisor",
        ended_at: new Date(endedAtMs),
        recorded_by: user.id,
        reason: d.reason,
        operation_id: null,
      })
      .execute();
    await appendAudit(trx, [
      {
        shopId: user.shopId,
        actorId: user.id,
        action: "clock.closed",
        entity: "bench_clock",
        entityId: clockId,
        workOrderId: clock.work_order_id,
        outcome: "accepted",
        reason: d.reason,
        detail: { endedAt: new Date(endedAtMs).toISOString() },
      },
    ]);
    return { clockId, endedAt: new Date(endedAtMs).toISOString() };
  });
}

/** How far back the supervisor's list of clocks left running looks. */
const RUNNING_LOOK_BACK_MS = 30 * 24 * 3600_000;

export interface RunningClock {
  clockId: string;
  workOrderId: string;
  workOrderNumber: number;
  mechanicName: string;
  stageKey: string | null;
  startedAt: string;
  minutes: number;
}

/** The shop's clocks still running (no clock-off, no close, no later clock-on of the same person), oldest first. */
export async function runningClocks(db: Kysely<Database>, shopId: string, nowMs = Date.now()): Promise<RunningClock[]> {
  const since = new Date(nowMs - RUNNING_LOOK_BACK_MS);
  const rows = await db
    .selectFrom("bench_clocks as c")
    .innerJoin("work_orders as w", "w.id", "c.work_order_id")
    .innerJoin("users as u", "u.id", "c.mechanic_id")
    .select(["c.id", "c.mechanic_id", "c.work_order_id", "w.number", "u.name", "c.job_procedure_id", "c.stage_key", "c.started_at"])
    .where("c.shop_id", "=", shopId)
    .where("c.started_at", ">=", since)
    .execute();
  if (!rows.length) return [];
  const ends = await db
    .selectFrom("bench_clock_ends")
    .select(["clock_id", "kind", "ended_at"])
    .where("clock_id", "=", sql<string>`ANY(${rows.map((r) => r.id)}::uuid[])`)
    .execute();
  const spans = clockSpans(
    rows.map((r) => ({
      id: r.id,
      mechanicId: r.mechanic_id,
      workOrderId: r.work_order_id,
      jobProcedureId: r.job_procedure_id,
      stageKey: r.stage_key,
      startedAtMs: r.started_at.getTime(),
    })),
    ends.map((e) => ({ clockId: e.clock_id, kind: e.kind, endedAtMs: e.ended_at.getTime() })),
    nowMs,
  );
  const byId = new Map(rows.map((r) => [r.id, r]));
  return spans
    .filter((s) => s.running)
    .map((s) => {
      const r = byId.get(s.id)!;
      return {
        clockId: s.id,
        workOrderId: s.workOrderId,
        workOrderNumber: r.number,
        mechanicName: r.name,
        stageKey: s.stageKey,
        startedAt: r.started_at.toISOString(),
        minutes: spanMinutes(s),
      };
    });
}
