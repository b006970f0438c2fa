import "server-only";
import type { Kysely, Transaction } from "kysely";
import { Refusal } from "@/lib/errors";
import { closedRecordRefusal, type RefusedAfterClose } from "@/lib/work-orders/closed-record";
import { appendAudit } from "../audit/append";
import type { Database } from "../schema";

class ClosedRecord extends Refusal {}

/**
 * Runs `write` in a transaction that holds the work order (FOR SHARE, so a handover cannot close it
 * half-way) after checking its record is still open (lib/work-orders/closed-record.ts). On a closed
 * record nothing is written: the refusal (409, in workshop words) goes to the audit log.
 */
export async function withOpenRecord<T>(
  db: Kysely<Database>,
  who: { shopId: string; userId: string },
  workOrderId: string,
  kind: RefusedAfterClose,
  write: (trx: Transaction<Database>) => Promise<T>,
): Promise<T> {
  try {
    return await db.transaction().execute(async (trx) => {
      const job = await trx
        .selectFrom("work_orders")
        .select(["number", "status"])
        .where("id", "=", workOrderId)
        .where("shop_id", "=", who.shopId)
        .forShare()
        .executeTakeFirst();
      if (!job) throw new Refusal("No such work order in this shop.", 404);
      const refusal = closedRecordRefusal(job, kind);
      if (refusal) throw new ClosedRecord(refusal, 409, [{ path: "workOrder", message: refusal }]);
      return write(trx);
    });
  } catch (e) {
    if (e instanceof ClosedRecord) {
      await appendAudit(db, [
        {
          shopId: who.shopId,
          actorId: who.userId,
          action: `work_order.add-${kind.replace(/ /g, "-")}`,
          entity: "work_order",
          entityId: workOrderId,
          workOrderId,
          outcome: "refused",
          reason: e.message,
        },
      ]);
    }
    throw e;
  }
}
