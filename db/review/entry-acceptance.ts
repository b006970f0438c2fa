import "server-only";
import { sql, type Kysely } from "kysely";
import { canReach } from "@/lib/auth/roles";
import type { SessionUser } from "@/lib/auth/session-user";
import { entryAcceptedOnItsOwn, type OpenItem } from "@/lib/work-orders/open-items";
import { CLOSED_STATUSES, isClosed, type WorkOrderStatus } from "@/lib/work-orders/status";
import { appendAudit } from "../audit/append";
import { loadOpenItems } from "../records/open-items";
import { notWithdrawn } from "../records/withdrawn";
import type { Database } from "../schema";

type Result =
  | { ok: true; acceptanceId: string; closedJob: boolean }
  | { ok: false; status: 403 | 404 | 409 | 422; reason: string; issues: Array<{ path: string; message: string }> };

/**
 * Accepts one flagged entry on its own, with a written reason: only on a closed job, and only an
 * entry no sign-off could carry — its stage's sign-off withdrawn or never made (the job handed
 * over by override), or, on no stage, a job with no standing sign-off at all. Such an entry would
 * otherwise stay open for good and hold back every revision of the stored build report. Any other
 * flagged entry is accepted with the decision on its stage's sign-off, where the supervisor sees
 * it in the stage's record. Nobody accepts an entry they recorded. Under the shop's sync lock, like
 * a decision; a refusal saves nothing but its audit entry.
 */
export async function acceptEntryOnItsOwn(
  db: Kysely<Database>,
  user: SessionUser,
  workOrderId: string,
  operationId: string,
  justification: string,
  deviceId: string | null = null,
): Promise<Result> {
  if (!canReach(user.role, "decide")) {
    return { ok: false, status: 403, reason: "Only a supervisor or the office may accept a flagged entry.", issues: [] };
  }
  return db.transaction().execute(async (trx) => {
    await sql`SELECT benchtag_lock_shop_sync(${user.shopId}::uuid)`.execute(trx);
    const job = await trx
      .selectFrom("work_orders")
      .select(["number", "status"])
      .where("id", "=", workOrderId)
      .where("shop_id", "=", user.shopId)
      .executeTakeFirst();
    if (!job) return { ok: false, status: 404, reason: "No such work order in this shop.", issues: [] };
    const entry = await trx
      .selectFrom("operations")
      .select(["id", "author_id", "flagged"])
      .where("id", "=", operationId)
      .where("work_order_id", "=", workOrderId)
      .where("shop_id", "=", user.shopId)
      .executeTakeFirst();

    const audit = (outcome: "accepted" | "refused", reason: string | null, detail: Record<string, unknown>) =>
      appendAudit(trx, [
        {
          shopId: user.shopId,
          actorId: user.id,
          deviceId,
          action: "review.accept-entry",
          entity: "operation",
          entityId: entry ? operationId : null,
          workOrderId,
          outcome,
          reason,
          detail: { operationId, justification, ...detail },
        },
      ]);
    const refuse = async (status: 404 | 409 | 422, reason: string, issues: Array<{ path: string; message: string }> = []) => {
      await audit("refused", reason, { issues });
      return { ok: false as const, status, reason, issues };
    };

    if (!entry) return refuse(404, `No such entry on work order #${job.number}.`);
    const item = (await loadOpenItems(trx, user.shopId, workOrderId))?.find((i) => i.key === `flagged_not_accepted:${operationId}`);
    if (!item) {
      return refuse(
        409,
        entry.flagged
          ? `This entry on work order #${job.number} is no longer waiting: it was accepted or withdrawn meanwhile. Reload the page.`
          : `This entry on work order #${job.number} was not flagged: there is nothing to accept.`,
      );
    }
    const where = item.stage ? `“${item.stage.title}”` : "any of its stages";
    if (!isClosed(job.status as WorkOrderStatus)) {
      return refuse(
        409,
        `Work order #${job.number} is still open: this entry is accepted with the supervisor's decision on the sign-off of ${where}, once it is signed off.`,
      );
    }
    if (item.signOffId) {
      return refuse(
        409,
        `Accept this entry with the decision on the sign-off of ${where}, on its review screen: it shows the stage's record.`,
      );
    }
    if (entry.author_id === user.id) {
      return refuse(422, "You recorded this entry yourself: another supervisor or the office must accept it.", [
        { path: "justification", message: "You recorded this entry yourself: another supervisor or the office must accept it." },
      ]);
    }

    const row = await trx
      .insertInto("flag_acceptances")
      .values({ shop_id: user.shopId, operation_id: operationId, decision_id: null, justification, accepted_by: user.id })
      .returning("id")
      .executeTakeFirstOrThrow();
    await audit("accepted", null, { entry: item.reason, stage: item.stage?.title ?? null, step: item.step?.title ?? null });
    return { ok: true, acceptanceId: row.id, closedJob: true };
  });
}

/**
 * The shop's closed jobs with flagged entries no sign-off can carry, each with those entries as
 * open items, for the review page (the office also sees them on the job's page). Entries `viewerId`
 * recorded are left out: someone else accepts them. Only jobs where a stage has no standing
 * sign-off (its latest withdrawn, or none) can hold such an entry, so only those are read in full;
 * a job whose every stage is signed off costs one index probe. At most `limit` jobs, newest first.
 */
export async function entriesToAcceptOnTheirOwn(
  db: Kysely<Database>,
  shopId: string,
  viewerId: string,
  limit = 20,
): Promise<Array<{ workOrderId: string; number: number; title: string; items: OpenItem[] }>> {
  const candidates = await db
    .selectFrom("work_orders as w")
    .select(["w.id", "w.number", "w.title"])
    .where("w.shop_id", "=", shopId)
    .where("w.status", "in", CLOSED_STATUSES)
    .where(({ exists, selectFrom }) =>
      exists(
        selectFrom("operations as o")
          .select("o.id")
          .whereRef("o.work_order_id", "=", "w.id")
          .where("o.shop_id", "=", shopId)
          .where("o.flagged", "=", true)
          .where("o.author_id", "<>", viewerId)
          .where((eb) => eb.not(eb.exists(eb.selectFrom("flag_acceptances as a").select("a.id").whereRef("a.operation_id", "=", "o.id"))))
          .where(notWithdrawn("o.id")),
      ),
    )
    // a stage with no standing sign-off, or no procedure at all
    .where(
      sql<boolean>`(
        NOT EXISTS (SELECT 1 FROM job_procedures jp0 WHERE jp0.work_order_id = w.id)
        OR EXISTS (
          SELECT 1 FROM job_procedures jp
          JOIN (SELECT DISTINCT template_version_id, stage_key FROM template_steps) st ON st.template_version_id = jp.template_version_id
          WHERE jp.work_order_id = w.id
            AND NOT EXISTS (
              SELECT 1 FROM (
                SELECT s.id FROM sign_offs s JOIN operations so ON so.id = s.id
                WHERE s.job_procedure_id = jp.id AND s.stage_key = st.stage_key
                ORDER BY so.seq DESC LIMIT 1
              ) latest
              WHERE ${notWithdrawn("latest.id")}
            )
        )
      )`,
    )
    .orderBy("w.number", "desc")
    .limit(limit)
    .execute();
  if (candidates.length === 0) return [];
  // the viewer's own flagged entries on these jobs, read once: someone else accepts those
  const own = new Set(
    (
      await db
        .selectFrom("operations")
        .select("id")
        .where(
          "work_order_id",
          "in",
          candidates.map((j) => j.id),
        )
        .where("flagged", "=", true)
        .where("author_id", "=", viewerId)
        .execute()
    ).map((o) => o.id),
  );
  const listed = (i: OpenItem) => {
    const entryId = entryAcceptedOnItsOwn(i, true);
    return entryId !== null && !own.has(entryId);
  };
  const loaded = await Promise.all(
    candidates.map(async (j) => ({
      workOrderId: j.id,
      number: j.number,
      title: j.title,
      items: ((await loadOpenItems(db, shopId, j.id)) ?? []).filter(listed),
    })),
  );
  return loaded.filter((j) => j.items.length > 0);
}
