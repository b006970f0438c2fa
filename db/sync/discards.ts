import "server-only";
import { sql, type Kysely } from "kysely";
import type { SessionUser } from "@/lib/auth/session-user";
import { isUuid } from "@/lib/ids";
import { storableCopy } from "@/lib/safe-values";
import type { DiscardRequest, DiscardResponse } from "@/lib/sync/discards";
import type { AuditEntry } from "../audit/append";
import type { Database } from "../schema";
import { existingOperations } from "./context";
import { heldOnFile, resolveHeld } from "./pending";
import { appendAuditBatch, lockShopForSync } from "./write";

/**
 * Writes down entries a tablet discards: what each was (a storable copy, however malformed), why
 * the server refused or held it, and why the person lets it go — one audit row each
 * (`sync.discarded`), once however often the tablet asks. A held entry is marked discarded, so it is
 * never applied later. An id the server holds as recorded work is not discarded: the answer says
 * `stored` (recorded work is withdrawn by a new record, never discarded).
 */
export async function recordDiscards(db: Kysely<Database>, user: SessionUser, req: DiscardRequest): Promise<DiscardResponse> {
  return db.transaction().execute(async (trx) => {
    await lockShopForSync(trx, user.shopId);
    const uuids = [...new Set(req.discards.map((d) => d.id).filter(isUuid))];
    const [onFile, held, logged] = await Promise.all([
      existingOperations(trx, uuids),
      heldOnFile(trx, uuids),
      trx
        .selectFrom("audit_log")
        .select("entity_id")
        .where("entity", "=", "operation")
        .where("action", "=", "sync.discarded")
        .where("actor_id", "=", user.id)
        .where("entity_id", "=", sql<string>`ANY(${req.discards.map((d) => String(storableCopy(d.id)))}::text[])`)
        .execute()
        .then((rows) => new Set(rows.map((r) => r.entity_id))),
    ]);
    const jobIds = [
      ...new Set(
        req.discards.flatMap((d) => {
          const id = (d.operation as { workOrderId?: unknown } | null)?.workOrderId;
          return isUuid(id) ? [id] : [];
        }),
      ),
    ];
    const ownJobs = new Set(
      jobIds.length
        ? (
            await trx
              .selectFrom("work_orders")
              .select("id")
              .where("shop_id", "=", user.shopId)
              .where("id", "=", sql<string>`ANY(${jobIds}::uuid[])`)
              .execute()
          ).map((w) => w.id)
        : [],
    );

    const results: DiscardResponse["results"] = [];
    const entries: AuditEntry[] = [];
    const resolved: string[] = [];
    for (const d of req.discards) {
      if (onFile.has(d.id)) {
        results.push({ id: d.id, outcome: "stored" });
        continue;
      }
      results.push({ id: d.id, outcome: "discarded" });
      const wasHeld = held.get(d.id)?.authorId === user.id;
      if (wasHeld) resolved.push(d.id);
      const entityId = String(storableCopy(d.id));
      if (logged.has(entityId)) continue;
      logged.add(entityId);
      const jobId = (d.operation as { workOrderId?: unknown } | null)?.workOrderId;
      const kind = (d.operation as { kind?: unknown } | null)?.kind;
      entries.push({
        shopId: user.shopId,
        actorId: user.id,
        deviceId: req.deviceId,
        action: "sync.discarded",
        entity: "operation",
        entityId,
        workOrderId: isUuid(jobId) && ownJobs.has(jobId) ? jobId : null,
        outcome: "accepted",
        reason: d.reason,
        detail: {
          kind: typeof kind === "string" ? storableCopy(kind.slice(0, 100)) : null,
          refusedReason: storableCopy(d.refusedReason),
          wasHeld,
          operation: storableCopy(d.operation),
        },
      });
    }
    await resolveHeld(trx, resolved, "discarded");
    await appendAuditBatch(trx, entries);
    return { results };
  });
}
