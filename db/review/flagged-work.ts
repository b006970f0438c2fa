import "server-only";
import { notWithdrawn } from "../records/withdrawn";
import { sql, type Kysely } from "kysely";
import { idsNamedIn, placeOfEntry, type FlaggedEntry, type PlaceLookup, type StageRef } from "@/lib/review/flagged-work";
import type { Database } from "../schema";

// Flagged bench entries (any operation the sync kept and flagged) with their written acceptances,
// and what it takes to place each on its stage (lib/review/flagged-work.ts). Scoped by shop.

const iso = (d: Date) => d.toISOString();

/** Every flagged entry of these work orders (accepted ones too, unless `onlyOpen`), by work order, in sequence order. */
export async function flaggedEntriesOf(
  db: Kysely<Database>,
  shopId: string,
  workOrderIds: readonly string[] | "all",
  opts: { onlyOpen?: boolean } = {},
): Promise<Map<string, FlaggedEntry[]>> {
  if (workOrderIds !== "all" && workOrderIds.length === 0) return new Map();
  let q = db
    .selectFrom("operations as o")
    .leftJoin("flag_acceptances as a", "a.operation_id", "o.id")
    .select([
      "o.id",
      "o.work_order_id",
      "o.kind",
      "o.payload",
      "o.flag_reason",
      sql<string>`o.seq::text`.as("seq"),
      "o.author_id",
      "o.device_time",
      "o.received_at",
      "a.decision_id",
      "a.justification",
      "a.accepted_by",
      "a.accepted_at",
    ])
    .where("o.shop_id", "=", shopId)
    .where("o.flagged", "=", true)
    // a withdrawn entry stops counting: it is listed with the withdrawn entries, with who and why
    .where(notWithdrawn("o.id"));
  if (workOrderIds !== "all") q = q.where("o.work_order_id", "in", workOrderIds);
  if (opts.onlyOpen) q = q.where("a.id", "is", null);
  const rows = await q.orderBy("o.seq").execute();
  const out = new Map<string, FlaggedEntry[]>();
  for (const r of rows) {
    const entry: FlaggedEntry = {
      operationId: r.id,
      kind: r.kind,
      payload: r.payload,
      flagReason: r.flag_reason ?? "flagged by the sync",
      seq: r.seq,
      authorId: r.author_id,
      deviceTime: iso(r.device_time),
      receivedAt: iso(r.received_at),
      acceptance:
        r.justification && r.accepted_by && r.accepted_at
          ? { decisionId: r.decision_id, justification: r.justification, acceptedBy: r.accepted_by, acceptedAt: iso(r.accepted_at) }
          : null,
    };
    out.set(r.work_order_id, [...(out.get(r.work_order_id) ?? []), entry]);
  }
  return out;
}

/**
 * What placing these entries (flagged ones, or any of the job's) on their stages needs, per work order: the steps of its pinned
 * procedures by stage, its timers' steps, and the operations the entries name (followed a few links).
 */
export async function placeLookups(
  db: Kysely<Database>,
  entries: ReadonlyMap<string, ReadonlyArray<Pick<FlaggedEntry, "payload">>>,
): Promise<Map<string, PlaceLookup>> {
  const jobs = [...entries.keys()];
  const out = new Map<string, PlaceLookup>();
  if (jobs.length === 0) return out;
  const [steps, timers] = await Promise.all([
    db
      .selectFrom("job_procedures as jp")
      .innerJoin("template_steps as ts", "ts.template_version_id", "jp.template_version_id")
      .select(["jp.work_order_id", "jp.id as jobProcedureId", "ts.id as stepId", "ts.stage_key"])
      .where("jp.work_order_id", "in", jobs)
      .orderBy("jp.position")
      .execute(),
    db.selectFrom("timers").select(["id", "work_order_id", "step_id"]).where("work_order_id", "in", jobs).execute(),
  ]);
  const operations = new Map<string, { workOrderId: string; kind: string; payload: unknown }>();
  let wanted = new Set([...entries.values()].flat().flatMap((e) => idsNamedIn(e.payload)));
  for (let depth = 0; depth < 4 && wanted.size > 0; depth++) {
    const found = await db
      .selectFrom("operations")
      .select(["id", "work_order_id", "kind", "payload"])
      .where("id", "in", [...wanted])
      .where("work_order_id", "in", jobs)
      .execute();
    wanted = new Set();
    for (const o of found) {
      operations.set(o.id, { workOrderId: o.work_order_id, kind: o.kind, payload: o.payload });
      for (const id of idsNamedIn(o.payload)) if (!operations.has(id)) wanted.add(id);
    }
  }
  for (const job of jobs) {
    const stageOfStep = new Map<string, StageRef>();
    // a template version pinned twice on one job: its steps count for the first procedure
    for (const s of steps)
      if (s.work_order_id === job && !stageOfStep.has(s.stepId))
        stageOfStep.set(s.stepId, { jobProcedureId: s.jobProcedureId, stageKey: s.stage_key });
    out.set(job, {
      stageOfStep,
      stepOfTimer: new Map(timers.filter((t) => t.work_order_id === job).map((t) => [t.id, t.step_id])),
      operations: new Map([...operations].filter(([, o]) => o.workOrderId === job).map(([id, o]) => [id, o])),
    });
  }
  return out;
}

/**
 * The stages of the shop that have flagged entries nobody has accepted yet, as "jobProcedureId|stageKey"
 * (the review queue puts an approved stage among them back in front of the supervisor).
 */
export async function stagesWithOpenFlags(db: Kysely<Database>, shopId: string): Promise<string[]> {
  const entries = await flaggedEntriesOf(db, shopId, "all", { onlyOpen: true });
  const lookups = await placeLookups(db, entries);
  const out = new Set<string>();
  for (const [job, list] of entries) {
    for (const e of list) {
      const place = placeOfEntry(e, lookups.get(job)!).stage;
      if (place) out.add(`${place.jobProcedureId}|${place.stageKey}`);
    }
  }
  return [...out];
}
