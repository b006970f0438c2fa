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

    const refuse = async (status: 404 | 409 | 422, reason: string, issues: Array<{ path: string; message: string }> = []) => {
      await appendAudit(trx, [
        {
          shopId: user.shopId,
          actorId: user.id,
          deviceId,
          action: "review.accept-entry",
          entity: "operation",
          entityId: entry ? operationId : null,
          workOrderId,
          outcome: "refused",
          reason,
          detail: { operationId, justification, issues },
        },
      ]);
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
    await appendAudit(trx, [
      {
        shopId: user.shopId,
        actorId: user.id,
        deviceId,
        action: "review.accept-entry",
        entity: "operation",
        entityId: operationId,
        workOrderId,
        outcome: "accepted",
        detail: { operationId, justification, entry: item.reason, stage: item.stage?.title ?? null, step: item.step?.title ?? null },
      },
    ]);
    return { ok: true, acceptanceId: row.id, closedJob: true };
  });
}

/**
 * The shop's closed jobs with flagged entries no sign-off can carry, each with those entries as
 * open items (for the supervisor's review page; the office sees them on the job's page). Read from
 * the flagged entries nobody accepted on closed jobs, at most `limit` jobs, newest number first.
 */
export async function entriesToAcceptOnTheirOwn(
  db: Kysely<Database>,
  shopId: string,
  limit = 20,
): Promise<Array<{ workOrderId: string; number: number; title: string; items: OpenItem[] }>> {
  const jobs = await db
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
          .where((eb) => eb.not(eb.exists(eb.selectFrom("flag_acceptances as a").select("a.id").whereRef("a.operation_id", "=", "o.id"))))
          .where(notWithdrawn("o.id")),
      ),
    )
    .orderBy("w.number", "desc")
    .limit(limit)
    .execute();
  const out = [];
  for (const j of jobs) {
    const items = ((await loadOpenItems(db, shopId, j.id)) ?? []).filter((i) => entryAcceptedOnItsOwn(i, true));
    if (items.length) out.push({ workOrderId: j.id, number: j.number, title: j.title, items });
  }
  return out;
}
