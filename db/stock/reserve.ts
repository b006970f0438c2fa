import "server-only";
import type { Kysely, Transaction } from "kysely";
import type { SessionUser } from "@/lib/auth/session-user";
import { Refusal } from "@/lib/errors";
import { lotName } from "@/lib/stock/draw";
import type { ReservationInput } from "@/lib/stock/input";
import { isClosed, STATUS_LABELS } from "@/lib/work-orders/status";
import { appendAudit } from "../audit/append";
import type { Database } from "../schema";
import { lockLots, outstandingReservations } from "./balances";

// Putting stock aside for a job, and letting it go again. A reservation is a movement; letting it
// go is a second movement pointing at it, with a reason. The lot's `reserved` balance changes in
// the same transaction, under the lot's row lock, so two people cannot put aside the same part.

/** Puts `quantity` of a lot aside for a job; refused when that much is not free. */
export async function reserveToJob(db: Kysely<Database>, user: SessionUser, input: ReservationInput) {
  return db.transaction().execute(async (trx) => {
    // held while this is decided: a job closing at this moment (which lets its stock go) is seen
    const job = await trx
      .selectFrom("work_orders")
      .select(["id", "number", "status"])
      .where("shop_id", "=", user.shopId)
      .where("number", "=", input.workOrderNumber)
      .forShare()
      .executeTakeFirst();
    if (!job)
      throw new Refusal(`There is no job #${input.workOrderNumber} in this shop.`, 422, [
        { path: "workOrderNumber", message: `No job #${input.workOrderNumber}.` },
      ]);
    if (isClosed(job.status))
      throw new Refusal(`Job #${job.number} is ${STATUS_LABELS[job.status].toLowerCase()}: stock cannot be put aside for it.`, 409, [
        { path: "workOrderNumber", message: "closed job" },
      ]);
    const lot = await trx
      .selectFrom("stock_lots as l")
      .innerJoin("stock_items as i", "i.id", "l.item_id")
      .select(["l.id", "l.item_id as itemId", "l.on_hand as onHand", "l.reserved", "l.batch", "l.serial", "i.part_number as partNumber"])
      .where("l.id", "=", input.lotId)
      .where("l.shop_id", "=", user.shopId)
      .forUpdate("l")
      .executeTakeFirst();
    if (!lot) throw new Refusal("No such stock in this shop.", 404, [{ path: "lotId", message: "not found" }]);
    const free = Math.max(0, lot.onHand - lot.reserved);
    if (input.quantity > free)
      throw new Refusal(
        `Only ${free} of part ${lot.partNumber} ${lotName(lot)} ${free === 1 ? "is" : "are"} free (${lot.onHand} on the shelf, ${lot.reserved} put aside already).`,
        409,
        [{ path: "quantity", message: `at most ${free}` }],
      );
    const movement = await trx
      .insertInto("stock_movements")
      .values({
        shop_id: user.shopId,
        item_id: lot.itemId,
        lot_id: lot.id,
        kind: "reserved",
        quantity: input.quantity,
        work_order_id: job.id,
        recorded_by: user.id,
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    await trx
      .updateTable("stock_lots")
      .set((eb) => ({ reserved: eb("reserved", "+", input.quantity) }))
      .where("id", "=", lot.id)
      .execute();
    await appendAudit(trx, [
      {
        shopId: user.shopId,
        actorId: user.id,
        action: "stock.reserved",
        entity: "stock_movement",
        entityId: movement.id,
        workOrderId: job.id,
        outcome: "accepted",
        detail: { lotId: lot.id, quantity: input.quantity },
      },
    ]);
    return { id: movement.id };
  });
}

/** Lets go what is still put aside by a reservation (less what the job's fits already used), with a reason. */
export async function releaseReservation(db: Kysely<Database>, user: SessionUser, reservationId: string, reason: string) {
  return db.transaction().execute(async (trx) => {
    const res = await trx
      .selectFrom("stock_movements")
      .select(["id", "item_id", "lot_id", "work_order_id", "quantity"])
      .where("id", "=", reservationId)
      .where("shop_id", "=", user.shopId)
      .where("kind", "=", "reserved")
      .executeTakeFirst();
    if (!res) throw new Refusal("No such reservation in this shop.", 404);
    // The lot's lock first: fits and other releases of this lot wait.
    await lockLots(trx, [res.lot_id!]);
    const already = await trx.selectFrom("stock_movements").select("id").where("releases_id", "=", res.id).executeTakeFirst();
    if (already) throw new Refusal("This reservation was already let go.", 409);
    const outstanding = (await outstandingReservations(trx, [res.lot_id!])).get(res.lot_id!)?.get(res.work_order_id!) ?? 0;
    const quantity = Math.min(res.quantity, outstanding);
    if (quantity <= 0) throw new Refusal("Nothing of this reservation is left to let go: the job's fits used it.", 409);
    const movement = await writeRelease(
      trx,
      { shopId: user.shopId, userId: user.id },
      { id: res.id, itemId: res.item_id, lotId: res.lot_id!, workOrderId: res.work_order_id! },
      quantity,
      reason,
    );
    return { id: movement.id, quantity };
  });
}

/**
 * Lets go everything still put aside for a job that has just closed (cancelled, or handed over with
 * parts it never used), in the closing move's transaction, with the move as the reason: a closed job
 * no longer holds shelf stock the next job needs. Each reservation gets its "released" movement for
 * what its job's fits did not use, and each lot its balance back, under the lots' row locks.
 */
export async function releaseReservationsOfClosedJob(
  trx: Transaction<Database>,
  who: { shopId: string; userId: string },
  job: { id: string; number: number },
  reason: string,
): Promise<number> {
  const open = await trx
    .selectFrom("stock_movements as m")
    .select(["m.id", "m.item_id", "m.lot_id", "m.quantity"])
    .where("m.shop_id", "=", who.shopId)
    .where("m.work_order_id", "=", job.id)
    .where("m.kind", "=", "reserved")
    .where((eb) => eb.not(eb.exists(eb.selectFrom("stock_movements as r").select("r.id").whereRef("r.releases_id", "=", "m.id"))))
    .orderBy("m.recorded_at")
    .orderBy("m.id")
    .execute();
  if (!open.length) return 0;
  const lotIds = [...new Set(open.map((r) => r.lot_id!))].sort();
  await lockLots(trx, lotIds);
  const held = await outstandingReservations(trx, lotIds);
  let released = 0;
  for (const res of open) {
    const left = held.get(res.lot_id!)?.get(job.id) ?? 0;
    const quantity = Math.min(res.quantity, left);
    if (quantity <= 0) continue;
    held.get(res.lot_id!)!.set(job.id, left - quantity);
    await writeRelease(trx, who, { id: res.id, itemId: res.item_id, lotId: res.lot_id!, workOrderId: job.id }, quantity, reason);
    released += quantity;
  }
  return released;
}

/**
 * Lets go `quantity` of a reservation: its "released" movement pointing at it (a reservation is let
 * go once: releases_id is unique), the lot's balance, and the audit entry. The caller holds the
 * lot's row lock and has worked out what is left of the reservation.
 */
async function writeRelease(
  trx: Transaction<Database>,
  who: { shopId: string; userId: string },
  res: { id: string; itemId: string; lotId: string; workOrderId: string },
  quantity: number,
  reason: string,
): Promise<{ id: string }> {
  const movement = await trx
    .insertInto("stock_movements")
    .values({
      shop_id: who.shopId,
      item_id: res.itemId,
      lot_id: res.lotId,
      kind: "released",
      quantity,
      work_order_id: res.workOrderId,
      releases_id: res.id,
      reason,
      recorded_by: who.userId,
    })
    .returning("id")
    .executeTakeFirstOrThrow();
  await trx
    .updateTable("stock_lots")
    .set((eb) => ({ reserved: eb("reserved", "-", quantity) }))
    .where("id", "=", res.lotId)
    .execute();
  await appendAudit(trx, [
    {
      shopId: who.shopId,
      actorId: who.userId,
      action: "stock.released",
      entity: "stock_movement",
      entityId: movement.id,
      workOrderId: res.workOrderId,
      outcome: "accepted",
      reason,
      detail: { reservationId: res.id, quantity },
    },
  ]);
  return movement;
}
