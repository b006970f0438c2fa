import "server-only";
import { notWithdrawn } from "../records/withdrawn";
import { sql, type Kysely } from "kysely";
import type { QueueQuery } from "@/lib/review/list-queries";
import type { WorkOrderStatus } from "@/lib/work-orders/status";
import { stagesWithOpenFlags } from "./flagged-work";
import type { Database } from "../schema";

// The review queue: for each stage of each job of the shop, its newest sign-off when no decision
// has been made on it yet — whatever the job's state, a job handed over with open items included —
// or when it was approved but work needing a decision came in after: a flagged entry nobody has
// accepted (any kind; placed on its stage by lib/review/flagged-work.ts), or a current reading
// out of tolerance nobody has let stand. Every query is scoped by shop.

export interface QueueRow {
  signOffId: string;
  workOrderId: string;
  number: number;
  jobTitle: string;
  make: string;
  model: string;
  tagCode: string;
  stageKey: string;
  stageTitle: string;
  procedureName: string;
  mechanicId: string;
  mechanicName: string;
  deviceTime: string;
  receivedAt: string;
  flagReason: string | null;
  outOfTolerance: number;
  /** The stage was sent back before and this is the sign-off after the redo. */
  resubmitted: boolean;
  /** Approved, but back for another look: why (null: it has no decision yet). */
  backAfterApproval: "flagged" | "out_of_tolerance" | null;
  jobStatus: WorkOrderStatus;
  /** The office handed the job over with items open (a recorded override). */
  handedOverWithOpenItems: boolean;
}

const SORT_SQL: Record<QueueQuery["sort"], string> = {
  signed: "q.seq",
  job: "q.number",
  bike: "q.tag_code",
  mechanic: "q.mechanic_name",
  outOfTolerance: "q.out_of_tolerance",
};

/** Where the queue's candidates come from: the small table of what waits, or (the reference it must agree with) the whole history. */
export type QueueSource = "waiting" | "history";

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/**
 * The newest sign-off (not withdrawn) of each candidate stage. From review_waiting (kept by
 * triggers; migration 2026_12_06_130) plus the stages with open flagged entries, so the cost follows
 * what waits; or, as the reference, from every sign-off of the shop.
 */
function latest(shopId: string, openFlagStages: readonly string[], source: QueueSource) {
  const signOff = sql`s.id, s.work_order_id, s.job_procedure_id, s.stage_key, s.signed_by, s.device_time, s.received_at, o.seq, o.flag_reason`;
  if (source === "history")
    return sql`
      SELECT DISTINCT ON (s.job_procedure_id, s.stage_key) ${signOff}, NULL::int AS known_out_of_tolerance
      FROM sign_offs s
      JOIN operations o ON o.id = s.id
      JOIN work_orders w ON w.id = s.work_order_id
      WHERE w.shop_id = ${shopId}::uuid
        -- a withdrawn sign-off waits for nobody: the stage waits for a new one
        AND ${notWithdrawn("s.id")}
      ORDER BY s.job_procedure_id, s.stage_key, o.seq DESC`;
  const flagged = openFlagStages
    .map((k) => [k.slice(0, k.indexOf("|")), k.slice(k.indexOf("|") + 1)])
    .filter(([jobProcedureId]) => UUID.test(jobProcedureId));
  const table = sql`SELECT rw.sign_off_id AS id, rw.out_of_tolerance FROM review_waiting rw WHERE rw.shop_id = ${shopId}::uuid`;
  // no stage with open flagged work (the usual case): the table alone, a smaller query to plan
  const candidates =
    flagged.length === 0
      ? table
      : sql`${table}
      UNION ALL
      SELECT newest.id, NULL::int
      FROM unnest(${flagged.map((f) => f[0])}::uuid[], ${flagged.map((f) => f[1])}::text[]) AS f(job_procedure_id, stage_key)
      CROSS JOIN LATERAL (
        SELECT s.id FROM sign_offs s JOIN operations o ON o.id = s.id
        WHERE s.job_procedure_id = f.job_procedure_id AND s.stage_key = f.stage_key
          AND ${notWithdrawn("s.id")}
        ORDER BY o.seq DESC LIMIT 1
      ) newest
      WHERE NOT EXISTS (SELECT 1 FROM review_waiting rw WHERE rw.job_procedure_id = f.job_procedure_id AND rw.stage_key = f.stage_key)`;
  return sql`
    SELECT ${signOff}, c.out_of_tolerance AS known_out_of_tolerance
    FROM (${candidates}) c
    JOIN sign_offs s ON s.id = c.id
    JOIN operations o ON o.id = s.id
    JOIN work_orders w ON w.id = s.work_order_id
    WHERE w.shop_id = ${shopId}::uuid`;
}

/**
 * The queue as CTEs ending in `q`. `display`: with what the page shows (job, bike, mechanic, stage,
 * procedure, history); without it (the count), only what decides whether a sign-off waits.
 */
function waiting(shopId: string, openFlagStages: readonly string[], source: QueueSource, display = true) {
  const outOfTolerance = sql`
        -- kept in review_waiting; worked out here for the other candidates
        COALESCE(l.known_out_of_tolerance, (SELECT count(*) FROM current_measurements cm JOIN template_steps ts ON ts.id = cm.step_id
           WHERE cm.work_order_id = l.work_order_id AND ts.template_version_id = jp.template_version_id
             AND ts.stage_key = l.stage_key AND cm.verdict <> 'in'
             AND NOT EXISTS (SELECT 1 FROM reading_acceptances a WHERE a.measurement_id = cm.id)))::int AS out_of_tolerance,
        (SELECT d.decision FROM review_decisions d WHERE d.sign_off_id = l.id ORDER BY d.change_seq DESC LIMIT 1) AS standing,
        (l.job_procedure_id::text || '|' || l.stage_key) = ANY(${[...openFlagStages]}::text[]) AS open_flags`;
  const p = display
    ? sql`
      SELECT l.*, w.number, w.title AS job_title, b.make, b.model, b.tag_code, u.name AS mechanic_name,
        st.stage_title, v.name AS procedure_name, ${outOfTolerance},
        EXISTS (SELECT 1 FROM review_decisions d JOIN sign_offs e ON e.id = d.sign_off_id
           WHERE e.job_procedure_id = l.job_procedure_id AND e.stage_key = l.stage_key AND d.decision = 'sent_back') AS resubmitted,
        w.status AS job_status,
        EXISTS (SELECT 1 FROM status_overrides so WHERE so.work_order_id = l.work_order_id AND so.to_status = 'handed_over')
          AS handed_over_with_open_items
      FROM latest l
      JOIN work_orders w ON w.id = l.work_order_id
      JOIN bikes b ON b.id = w.bike_id
      JOIN users u ON u.id = l.signed_by
      JOIN job_procedures jp ON jp.id = l.job_procedure_id
      JOIN template_versions v ON v.id = jp.template_version_id
      JOIN LATERAL (SELECT stage_title FROM template_steps ts WHERE ts.template_version_id = jp.template_version_id
                    AND ts.stage_key = l.stage_key LIMIT 1) st ON true`
    : sql`
      SELECT l.id, ${outOfTolerance}
      FROM latest l
      JOIN job_procedures jp ON jp.id = l.job_procedure_id`;
  return sql`
    -- MATERIALIZED: each part is planned on its own (the queue is small, so nothing is lost by not
    -- folding the parts together, and planning the folded query took longer than running it)
    WITH latest AS MATERIALIZED (${latest(shopId, openFlagStages, source)}),
    p AS MATERIALIZED (${p}
    ),
    q AS (
      SELECT p.*, CASE WHEN p.standing IS NULL THEN NULL WHEN p.open_flags THEN 'flagged' ELSE 'out_of_tolerance' END AS back_after_approval
      FROM p
      WHERE p.standing IS NULL OR (p.standing = 'approved' AND (p.open_flags OR p.out_of_tolerance > 0))
    )
  `;
}

function filters(o: Partial<QueueQuery>) {
  const parts = [sql`true`];
  if (o.job !== undefined) parts.push(sql`q.number = ${o.job}`);
  if (o.mechanic) parts.push(sql`q.signed_by = ${o.mechanic}::uuid`);
  if (o.outOfTolerance === "yes") parts.push(sql`q.out_of_tolerance > 0`);
  if (o.outOfTolerance === "no") parts.push(sql`q.out_of_tolerance = 0`);
  if (o.q) {
    const like = `%${o.q.replace(/[\\%_]/g, (m) => `\\${m}`)}%`;
    parts.push(
      sql`(q.tag_code ILIKE ${like} OR q.make ILIKE ${like} OR q.model ILIKE ${like} OR (q.make || ' ' || q.model) ILIKE ${like})`,
    );
  }
  return sql.join(parts, sql` AND `);
}

/** One page of the queue, newest sign-off first unless another sort is asked for. */
export async function pageReviewQueue(
  db: Kysely<Database>,
  shopId: string,
  o: QueueQuery,
  source: QueueSource = "waiting",
): Promise<{ rows: QueueRow[]; total: number }> {
  const order = sql.raw(`${SORT_SQL[o.sort]} ${o.dir === "asc" ? "ASC" : "DESC"} NULLS LAST, q.seq DESC`);
  const w = waiting(shopId, await stagesWithOpenFlags(db, shopId), source);
  // one query for the page and the number of matches (a window count, computed before LIMIT): the
  // queue's plan is costly to make, so it is made once; a page past the end counts separately
  const rows = await sql<{
    id: string;
    work_order_id: string;
    number: number;
    job_title: string;
    make: string;
    model: string;
    tag_code: string;
    stage_key: string;
    stage_title: string;
    procedure_name: string;
    signed_by: string;
    mechanic_name: string;
    device_time: Date;
    received_at: Date;
    flag_reason: string | null;
    out_of_tolerance: number;
    resubmitted: boolean;
    back_after_approval: "flagged" | "out_of_tolerance" | null;
    job_status: WorkOrderStatus;
    handed_over_with_open_items: boolean;
    total: number;
  }>`${w} SELECT *, count(*) OVER ()::int AS total FROM q WHERE ${filters(o)} ORDER BY ${order} LIMIT ${o.size} OFFSET ${o.page * o.size}`.execute(
    db,
  );
  const total =
    rows.rows[0]?.total ??
    (o.page > 0 ? ((await sql<{ n: number }>`${w} SELECT count(*)::int AS n FROM q WHERE ${filters(o)}`.execute(db)).rows[0]?.n ?? 0) : 0);
  return {
    total,
    rows: rows.rows.map((r) => ({
      signOffId: r.id,
      workOrderId: r.work_order_id,
      number: r.number,
      jobTitle: r.job_title,
      make: r.make,
      model: r.model,
      tagCode: r.tag_code,
      stageKey: r.stage_key,
      stageTitle: r.stage_title,
      procedureName: r.procedure_name,
      mechanicId: r.signed_by,
      mechanicName: r.mechanic_name,
      deviceTime: r.device_time.toISOString(),
      receivedAt: r.received_at.toISOString(),
      flagReason: r.flag_reason,
      outOfTolerance: r.out_of_tolerance,
      resubmitted: r.resubmitted,
      backAfterApproval: r.back_after_approval,
      jobStatus: r.job_status,
      handedOverWithOpenItems: r.handed_over_with_open_items,
    })),
  };
}

/** How many sign-offs wait for review in the shop (the navigation shows it). */
export async function countReviewQueue(db: Kysely<Database>, shopId: string, source: QueueSource = "waiting"): Promise<number> {
  const w = waiting(shopId, await stagesWithOpenFlags(db, shopId), source, false);
  const r = await sql<{ n: number }>`${w} SELECT count(*)::int AS n FROM q`.execute(db);
  return r.rows[0]?.n ?? 0;
}

/** People who have signed off work in the shop (the queue's mechanic filter). */
export async function signersOfShop(db: Kysely<Database>, shopId: string) {
  return db
    .selectFrom("users")
    .select(["id", "name", "role"])
    .where("shop_id", "=", shopId)
    .where("role", "in", ["mechanic", "supervisor"])
    .orderBy("name")
    .execute();
}
