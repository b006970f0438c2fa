import "server-only";
import { notWithdrawn } from "./withdrawn";
import { sql, type Kysely, type Transaction } from "kysely";
import type { Database } from "../schema";

// Stored copies of the build report (report_revisions, append-only): revision 1 made at handover,
// then one per later accepted change. The PDF bytes live in object storage under `object_key`;
// the row keeps their SHA-256, the lines the report printed and what changed since the one before.

type Db = Kysely<Database> | Transaction<Database>;

export interface NewReportRevision {
  shopId: string;
  workOrderId: string;
  revision: number;
  objectKey: string;
  sha256: string;
  byteSize: number;
  lines: readonly string[];
  changes: readonly string[];
  basis: string;
  madeBy: string | null;
}

export async function insertReportRevision(db: Db, r: NewReportRevision) {
  return db
    .insertInto("report_revisions")
    .values({
      shop_id: r.shopId,
      work_order_id: r.workOrderId,
      revision: r.revision,
      handed_over: r.revision === 1,
      object_key: r.objectKey,
      sha256: r.sha256,
      byte_size: r.byteSize,
      lines: JSON.stringify(r.lines),
      changes: JSON.stringify(r.changes),
      basis: r.basis,
      made_by: r.madeBy,
    })
    .returning(["id", "revision", "made_at as madeAt"])
    .executeTakeFirstOrThrow();
}

/** Every stored copy of a work order's report, oldest first (without the printed lines). */
export async function reportRevisionsOf(db: Db, shopId: string, workOrderId: string) {
  return db
    .selectFrom("report_revisions as r")
    .leftJoin("users as u", "u.id", "r.made_by")
    .select([
      "r.revision",
      "r.handed_over as handedOver",
      "r.sha256",
      "r.byte_size as byteSize",
      "r.changes",
      "r.made_at as madeAt",
      "u.name as madeByName",
    ])
    .where("r.work_order_id", "=", workOrderId)
    .where("r.shop_id", "=", shopId)
    .orderBy("r.revision")
    .execute();
}

/** One stored copy (the latest when `revision` is null), with where its bytes are; undefined when none. */
export async function reportRevision(db: Db, shopId: string, workOrderId: string, revision: number | null) {
  let q = db
    .selectFrom("report_revisions")
    .select([
      "revision",
      "handed_over as handedOver",
      "object_key as objectKey",
      "sha256",
      "byte_size as byteSize",
      "lines",
      "basis",
      "made_at as madeAt",
    ])
    .where("work_order_id", "=", workOrderId)
    .where("shop_id", "=", shopId);
  q = revision === null ? q.orderBy("revision", "desc").limit(1) : q.where("revision", "=", revision);
  return q.executeTakeFirst();
}

/**
 * What the accepted record of a handed-over job rests on, as one comparable text: the review
 * decisions on its sign-offs (with the flag and reading acceptances made with them), its
 * withdrawn dyno runs and its flagged entries accepted on their own. A stored copy keeps it; when it differs later, an accepted change has come in.
 */
export async function acceptedBasis(db: Db, workOrderId: string): Promise<string> {
  const r = await sql<{ decisions: number; last_decision: string | null; withdrawn: number; on_own: number }>`
    SELECT
      (SELECT count(*)::int FROM review_decisions d JOIN sign_offs s ON s.id = d.sign_off_id WHERE s.work_order_id = ${workOrderId}::uuid) AS decisions,
      (SELECT max(d.change_seq)::text FROM review_decisions d JOIN sign_offs s ON s.id = d.sign_off_id WHERE s.work_order_id = ${workOrderId}::uuid) AS last_decision,
      (SELECT count(*)::int FROM dyno_runs r WHERE r.work_order_id = ${workOrderId}::uuid AND r.withdrawn_at IS NOT NULL) AS withdrawn,
      (SELECT count(*)::int FROM flag_acceptances a JOIN operations o ON o.id = a.operation_id
        WHERE o.work_order_id = ${workOrderId}::uuid AND a.decision_id IS NULL) AS on_own
  `.execute(db);
  const b = r.rows[0];
  // entries accepted on their own (db/review/entry-acceptance.ts) count only once there are some: older bases stay as stored
  const onOwn = b.on_own > 0 ? `; entries accepted on their own ${b.on_own}` : "";
  return `decisions ${b.decisions} up to ${b.last_decision ?? "none"}; withdrawn runs ${b.withdrawn}${onOwn}`;
}

/**
 * Entries of the job received after `since` (its handover) that were flagged and that no supervisor
 * has accepted yet (a withdrawn one no longer counts; its withdrawal does): work a revision of the
 * report must not print as the record. Every bench entry on a closed job is flagged.
 */
export async function lateEntriesAwaiting(db: Db, workOrderId: string, since: Date): Promise<number> {
  const r = await db
    .selectFrom("operations as o")
    .select((eb) => eb.fn.countAll<string>().as("n"))
    .where("o.work_order_id", "=", workOrderId)
    .where("o.flagged", "=", true)
    .where("o.received_at", ">", since)
    .where(({ not, exists, selectFrom }) =>
      not(exists(selectFrom("flag_acceptances as a").select("a.id").whereRef("a.operation_id", "=", "o.id"))),
    )
    .where(notWithdrawn("o.id"))
    .executeTakeFirstOrThrow();
  return Number(r.n);
}

/** The work order's status and when it was handed over (its last move to handed over), for the shop. */
export async function handoverOf(db: Db, shopId: string, workOrderId: string) {
  return db
    .selectFrom("work_orders as w")
    .select((eb) => [
      "w.status",
      "w.closed_at as closedAt",
      eb
        .selectFrom("work_order_transitions as t")
        .select((sub) => sub.fn.max("t.at").as("at"))
        .whereRef("t.work_order_id", "=", "w.id")
        .where("t.to_status", "=", "handed_over")
        .as("handedOverAt"),
    ])
    .where("w.id", "=", workOrderId)
    .where("w.shop_id", "=", shopId)
    .executeTakeFirst();
}

/** Runs `work` in a transaction holding the work order's report lock: one copy is made at a time. */
export async function withReportLock<T>(db: Kysely<Database>, workOrderId: string, work: (trx: Transaction<Database>) => Promise<T>) {
  return db.transaction().execute(async (trx) => {
    await sql`SELECT pg_advisory_xact_lock(4243, hashtext(${workOrderId}::text))`.execute(trx);
    return work(trx);
  });
}
