import "server-only";
import { notWithdrawn } from "../records/withdrawn";
import { sql, type Kysely, type Transaction } from "kysely";
import type { SessionUser } from "@/lib/auth/session-user";
import type { ComeBackFindingInput, OpenComeBackInput } from "@/lib/aftercare/come-backs";
import { Refusal } from "@/lib/errors";
import { formatDay } from "@/lib/format/dates";
import { CLOSED_STATUSES, STATUS_LABELS } from "@/lib/work-orders/status";
import { appendAudit } from "../audit/append";
import { loadHandoverReport } from "../records/handover-report";
import type { Database } from "../schema";
import { shopTimeZone } from "../shop/settings";
import { bookInWith } from "../shop/work-orders";

// Come-backs: a handed-over bike back with a fault, booked in as a work order of its own and
// linked to the work order it came back from. Opened by the office or a supervisor.

type Trx = Transaction<Database>;

/** A day as the shop's calendar reads it ("3 Dec 2026"). */
const dateOf = async (db: Kysely<Database>, shopId: string, d: Date) => formatDay(d, await shopTimeZone(db, shopId));

/** The come-back still open (its work order not handed over or cancelled) for an original work order, if any. */
async function openComeBackOf(db: Kysely<Database> | Trx, originalId: string) {
  return db
    .selectFrom("come_backs as c")
    .innerJoin("work_orders as w", "w.id", "c.work_order_id")
    .innerJoin("users as u", "u.id", "c.opened_by")
    .select(["c.id", "w.number", "c.opened_at as openedAt", "u.name as openedBy"])
    .where("c.original_work_order_id", "=", originalId)
    .where("w.status", "not in", CLOSED_STATUSES)
    .executeTakeFirst();
}

/** When a work order was handed over (its last move to handed over), or null. */
async function handedOverAt(db: Kysely<Database> | Trx, workOrderId: string): Promise<Date | null> {
  const t = await db
    .selectFrom("work_order_transitions")
    .select("at")
    .where("work_order_id", "=", workOrderId)
    .where("to_status", "=", "handed_over")
    .orderBy("at", "desc")
    .executeTakeFirst();
  return t?.at ?? null;
}

/** What the bench and the office see of a handed-over bike: its last handed-over job and any open come-back. */
export async function handedOverJobOfBike(db: Kysely<Database>, shopId: string, bikeId: string) {
  const last = await db
    .selectFrom("work_orders")
    .select(["id", "number", "title", "closed_at as closedAt"])
    .where("shop_id", "=", shopId)
    .where("bike_id", "=", bikeId)
    .where("status", "=", "handed_over")
    .orderBy("closed_at", "desc")
    .orderBy("number", "desc")
    .executeTakeFirst();
  if (!last) return null;
  const at = (await handedOverAt(db, last.id)) ?? last.closedAt;
  const open = await openComeBackOf(db, last.id);
  return {
    workOrderId: last.id,
    number: last.number,
    title: last.title,
    handedOverOn: at ? at.toISOString() : null,
    openComeBack: open ? { id: open.id, number: open.number } : null,
  };
}

/**
 * Opens a come-back: refused unless the original is handed over, and while another come-back of
 * the same original is open (named in the refusal). The new work order and the link are written in
 * one transaction, with the original locked so two offices opening at once make one.
 */
export async function openComeBack(db: Kysely<Database>, user: SessionUser, input: OpenComeBackInput) {
  const done = await db.transaction().execute(async (trx) => {
    const orig = await trx
      .selectFrom("work_orders")
      .select(["id", "number", "title", "status", "bike_id as bikeId"])
      .where("id", "=", input.originalWorkOrderId)
      .where("shop_id", "=", user.shopId)
      .forUpdate()
      .executeTakeFirst();
    if (!orig) throw new Refusal("No such work order in this shop.", 404);
    if (orig.status !== "handed_over")
      throw new Refusal(
        `Job #${orig.number} is ${STATUS_LABELS[orig.status].toLowerCase()}, not handed over: a come-back is opened only for a bike that has been handed over.`,
        409,
        [{ path: "originalWorkOrderId", message: `job #${orig.number} has not been handed over` }],
      );
    const open = await openComeBackOf(trx, orig.id);
    if (open)
      throw new Refusal(
        `Come-back #${open.number} for job #${orig.number} is still open (opened ${await dateOf(trx, user.shopId, open.openedAt)} by ${open.openedBy}): carry on with that one.`,
        409,
        [{ path: "originalWorkOrderId", message: `come-back #${open.number} is still open` }],
      );
    const wo = await bookInWith(trx, user.shopId, user.id, {
      bikeId: orig.bikeId,
      title: `Come-back of #${orig.number}: ${orig.title}`.slice(0, 160),
      complaint: input.riderReport,
      odometerKm: input.odometerKm,
    });
    const row = await trx
      .insertInto("come_backs")
      .values({
        shop_id: user.shopId,
        work_order_id: wo.id,
        original_work_order_id: orig.id,
        rider_report: input.riderReport,
        warranty_claimed: input.warrantyClaimed,
        opened_by: user.id,
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    await appendAudit(trx, [
      {
        shopId: user.shopId,
        actorId: user.id,
        action: "come_back.open",
        entity: "come_back",
        entityId: row.id,
        workOrderId: wo.id,
        outcome: "accepted",
        detail: { original: orig.number, number: wo.number, warrantyClaimed: input.warrantyClaimed },
      },
    ]);
    return { id: row.id, workOrderId: wo.id, number: wo.number };
  });
  return done;
}

/** The come-back linked to a work order (as the come-back or as its original), for links on the work order page. */
export async function comeBackLinksOf(db: Kysely<Database>, shopId: string, workOrderId: string) {
  const rows = await db
    .selectFrom("come_backs as c")
    .innerJoin("work_orders as w", "w.id", "c.work_order_id")
    .innerJoin("work_orders as o", "o.id", "c.original_work_order_id")
    .select(["c.id", "w.number as comeBackNumber", "o.number as originalNumber", "c.work_order_id as workOrderId", "w.status"])
    .where("c.shop_id", "=", shopId)
    .where((eb) => eb.or([eb("c.work_order_id", "=", workOrderId), eb("c.original_work_order_id", "=", workOrderId)]))
    .orderBy("c.opened_at")
    .execute();
  return {
    isComeBack: rows.find((r) => r.workOrderId === workOrderId) ?? null,
    comeBacks: rows.filter((r) => r.workOrderId !== workOrderId),
  };
}

/** One come-back with the original's record and the come-back's own, read by the same reader as the handover report. */
export async function comeBackView(db: Kysely<Database>, shopId: string, id: string) {
  const c = await db
    .selectFrom("come_backs as c")
    .innerJoin("users as u", "u.id", "c.opened_by")
    .select([
      "c.id",
      "c.work_order_id as workOrderId",
      "c.original_work_order_id as originalId",
      "c.rider_report as riderReport",
      "c.warranty_claimed as warrantyClaimed",
      "c.opened_at as openedAt",
      "u.name as openedBy",
    ])
    .where("c.shop_id", "=", shopId)
    .where("c.id", "=", id)
    .executeTakeFirst();
  if (!c) return null;
  const [original, now] = await Promise.all([loadHandoverReport(db, shopId, c.originalId), loadHandoverReport(db, shopId, c.workOrderId)]);
  if (!original || !now) return null;
  const findings = await db
    .selectFrom("come_back_findings as f")
    .innerJoin("users as u", "u.id", "f.recorded_by")
    .select([
      "f.id",
      "f.under_warranty as underWarranty",
      "f.cause",
      "f.note",
      "f.replaces_id as replacesId",
      "u.name as recordedBy",
      "f.recorded_at as recordedAt",
    ])
    .where("f.come_back_id", "=", id)
    .orderBy("f.recorded_at")
    .orderBy("f.id")
    .execute();
  const replaced = new Set(findings.map((f) => f.replacesId).filter(Boolean));
  return {
    comeBack: { ...c, originalHandedOverAt: await handedOverAt(db, c.originalId) },
    original,
    now,
    findings: findings.map((f) => ({ ...f, current: !replaced.has(f.id) })),
  };
}
export type ComeBackView = NonNullable<Awaited<ReturnType<typeof comeBackView>>>;

/**
 * Records a finding (warranty yes/no, cause, note). The first needs no reference; a later one must
 * name the current finding it replaces, so nothing is overwritten and two offices cannot both
 * replace the same one (replaces_id is unique).
 */
export async function recordComeBackFinding(db: Kysely<Database>, user: SessionUser, comeBackId: string, input: ComeBackFindingInput) {
  return db.transaction().execute(async (trx) => {
    const c = await trx
      .selectFrom("come_backs")
      .select(["id", "work_order_id as workOrderId"])
      .where("id", "=", comeBackId)
      .where("shop_id", "=", user.shopId)
      .forUpdate()
      .executeTakeFirst();
    if (!c) throw new Refusal("No such come-back in this shop.", 404);
    const current = await trx
      .selectFrom("come_back_findings as f")
      .innerJoin("users as u", "u.id", "f.recorded_by")
      .select(["f.id", "u.name", "f.recorded_at as at"])
      .where("f.come_back_id", "=", comeBackId)
      .where(({ not, exists, selectFrom }) =>
        not(exists(selectFrom("come_back_findings as r").select("r.id").whereRef("r.replaces_id", "=", "f.id"))),
      )
      .executeTakeFirst();
    const replaces = input.replacesId ?? null;
    if (current && replaces !== current.id)
      throw new Refusal(
        `A finding is already on record (by ${current.name}, ${await dateOf(trx, user.shopId, current.at)}); a new one replaces it: reload the page and record it again.`,
        409,
        [{ path: "replacesId", message: "name the finding on record" }],
      );
    if (!current && replaces)
      throw new Refusal("There is no finding on record to replace.", 409, [{ path: "replacesId", message: "nothing to replace" }]);
    const row = await trx
      .insertInto("come_back_findings")
      .values({
        shop_id: user.shopId,
        come_back_id: comeBackId,
        under_warranty: input.underWarranty,
        cause: input.cause,
        note: input.note,
        replaces_id: replaces,
        recorded_by: user.id,
      })
      .returning(["id", "recorded_at as recordedAt"])
      .executeTakeFirstOrThrow();
    await appendAudit(trx, [
      {
        shopId: user.shopId,
        actorId: user.id,
        action: "come_back.finding",
        entity: "come_back",
        entityId: comeBackId,
        workOrderId: c.workOrderId,
        outcome: "accepted",
        detail: { findingId: row.id, cause: input.cause, underWarranty: input.underWarranty, replaces },
      },
    ]);
    return row;
  });
}

/** Every come-back of the shop, newest first, with its original and current finding. */
export async function listComeBacks(db: Kysely<Database>, shopId: string) {
  return db
    .selectFrom("come_backs as c")
    .innerJoin("work_orders as w", "w.id", "c.work_order_id")
    .innerJoin("work_orders as o", "o.id", "c.original_work_order_id")
    .innerJoin("bikes as b", "b.id", "w.bike_id")
    .leftJoin("come_back_findings as f", (j) =>
      j
        .onRef("f.come_back_id", "=", "c.id")
        .on(({ not, exists, selectFrom }) =>
          not(exists(selectFrom("come_back_findings as r").select("r.id").whereRef("r.replaces_id", "=", "f.id"))),
        ),
    )
    .select([
      "c.id",
      "w.number",
      "w.status",
      "o.number as originalNumber",
      "b.tag_code as tagCode",
      "b.make",
      "b.model",
      "c.warranty_claimed as warrantyClaimed",
      "c.opened_at as openedAt",
      "f.cause",
      "f.under_warranty as underWarranty",
    ])
    .where("c.shop_id", "=", shopId)
    .orderBy("c.opened_at", "desc")
    .execute();
}

/**
 * Come-backs grouped by the part batches fitted on their originals (parts withdrawn at the bench
 * do not count), with how many handed-over jobs got that batch in all, so a bad batch shows up.
 */
export async function comeBacksByBatch(db: Kysely<Database>, shopId: string) {
  const rows = await sql<{ partNumber: string; description: string; batch: string; comeBacks: string[]; fittedJobs: number }>`
    WITH fitted AS (
      SELECT p.work_order_id, p.part_number, p.description, p.batch, o.status,
        -- part and batch as compared everywhere else (lib/sync/parts.ts plainCode): "l24-118" is "L24 118"
        upper(regexp_replace(normalize(p.part_number, NFKC), '[^[:alnum:]]', '', 'g')) AS part_key,
        upper(regexp_replace(normalize(p.batch, NFKC), '[^[:alnum:]]', '', 'g')) AS batch_key
      FROM parts_fitted p
      JOIN work_orders o ON o.id = p.work_order_id
      WHERE p.shop_id = ${shopId} AND p.batch IS NOT NULL
        AND ${notWithdrawn("p.operation_id")}
    )
    SELECT min(f.part_number) AS "partNumber", min(f.description) AS description, min(f.batch) AS batch,
      array_agg(DISTINCT w.number::text) FILTER (WHERE c.id IS NOT NULL) AS "comeBacks",
      count(DISTINCT f.work_order_id) FILTER (WHERE f.status = 'handed_over')::int AS "fittedJobs"
    FROM fitted f
    LEFT JOIN come_backs c ON c.original_work_order_id = f.work_order_id
    LEFT JOIN work_orders w ON w.id = c.work_order_id
    GROUP BY f.part_key, f.batch_key
    HAVING count(c.id) > 0
    ORDER BY count(DISTINCT c.id) DESC, min(f.part_number), min(f.batch)
  `.execute(db);
  return rows.rows.map((r) => ({ ...r, comeBacks: r.comeBacks.map(Number).sort((a, b) => a - b) }));
}

/** Come-backs grouped by the procedure templates their originals ran, with how many handed-over jobs ran each. */
export async function comeBacksByTemplate(db: Kysely<Database>, shopId: string) {
  const rows = await sql<{ templateId: string; name: string; comeBacks: string[]; handedOverJobs: number }>`
    SELECT t.id AS "templateId", t.name,
      array_agg(DISTINCT w.number::text) FILTER (WHERE c.id IS NOT NULL) AS "comeBacks",
      count(DISTINCT o.id) FILTER (WHERE o.status = 'handed_over')::int AS "handedOverJobs"
    FROM procedure_templates t
    JOIN template_versions v ON v.template_id = t.id
    JOIN job_procedures jp ON jp.template_version_id = v.id
    JOIN work_orders o ON o.id = jp.work_order_id
    LEFT JOIN come_backs c ON c.original_work_order_id = o.id
    LEFT JOIN work_orders w ON w.id = c.work_order_id
    WHERE t.shop_id = ${shopId}
    GROUP BY t.id, t.name
    HAVING count(c.id) > 0
    ORDER BY count(DISTINCT c.id) DESC, t.name
  `.execute(db);
  return rows.rows.map((r) => ({ ...r, comeBacks: r.comeBacks.map(Number).sort((a, b) => a - b) }));
}
