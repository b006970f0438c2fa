import "server-only";
import { sql, type Kysely, type Transaction } from "kysely";
import type { ClockState } from "@/lib/sync/clocks";
import type { Operation } from "@/lib/sync/operations";
import type { Database } from "../schema";

// What the merge needs for time at the bench: the clocks the batch names, the recent clocks of the
// mechanics who clock on (one open clock per mechanic), and the ends on record of all of them.

type Db = Kysely<Database> | Transaction<Database>;

/** How far back a clock-on looks for a clock of the same mechanic still running. */
const LOOK_BACK_MS = 45 * 24 * 3600_000;

export async function loadClockState(db: Db, ops: readonly Operation[]): Promise<ClockState> {
  const state: ClockState = { clocks: new Map(), ends: [] };
  const clockIds = new Set<string>();
  const authors = new Set<string>();
  let earliest = Number.POSITIVE_INFINITY;
  for (const op of ops) {
    if (op.kind === "clock.off") clockIds.add(op.payload.clockId);
    else if (op.kind === "clock.on") {
      clockIds.add(op.payload.clockId);
      authors.add(op.authorId);
      earliest = Math.min(earliest, Date.parse(op.payload.startedAt));
    }
  }
  if (!clockIds.size) return state;
  const since = new Date(Number.isFinite(earliest) ? earliest - LOOK_BACK_MS : 0);
  const clocks = await db
    .selectFrom("bench_clocks as c")
    .innerJoin("work_orders as w", "w.id", "c.work_order_id")
    .select(["c.id", "c.mechanic_id", "c.work_order_id", "w.number", "c.job_procedure_id", "c.stage_key", "c.started_at"])
    .where((eb) =>
      eb.or([
        eb("c.id", "=", sql<string>`ANY(${[...clockIds]}::uuid[])`),
        eb.and([eb("c.mechanic_id", "=", sql<string>`ANY(${[...authors]}::uuid[])`), eb("c.started_at", ">=", since)]),
      ]),
    )
    .execute();
  for (const c of clocks) {
    state.clocks.set(c.id, {
      id: c.id,
      mechanicId: c.mechanic_id,
      workOrderId: c.work_order_id,
      workOrderNumber: c.number,
      jobProcedureId: c.job_procedure_id,
      stageKey: c.stage_key,
      startedAtMs: c.started_at.getTime(),
    });
  }
  if (!clocks.length) return state;
  const ends = await db
    .selectFrom("bench_clock_ends")
    .select(["clock_id", "kind", "ended_at"])
    .where("clock_id", "=", sql<string>`ANY(${clocks.map((c) => c.id)}::uuid[])`)
    .execute();
  for (const e of ends) state.ends.push({ clockId: e.clock_id, kind: e.kind, endedAtMs: e.ended_at.getTime() });
  return state;
}
