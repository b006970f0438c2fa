import "server-only";
import { sql, type Insertable, type Transaction } from "kysely";
import { planDraw, stockFlagReason, type DrawPlan } from "@/lib/stock/draw";
import type { OperationOf } from "@/lib/sync/operations";
import { plainCode } from "@/lib/sync/parts";
import type { Database } from "../schema";
import { lockedLots, lockLots } from "./balances";

// Parts fitted at the bench draw from stock, in the merge's transaction. A fit is never refused or
// lost for stock: it is recorded, the draw stops at zero (the lots' CHECK (on_hand >= 0) would
// refuse more), and what the shelf could not cover is counted on the movement and flagged for the
// supervisor. Merges of a shop run one at a time and the lots are locked FOR UPDATE, so two
// tablets fitting the last one are decided one after the other: the second is the short one.

type Tx = Transaction<Database>;
/** A part fitted, as a draw needs it: a bench fit, or one the office recorded (db/office/parts.ts). */
type Fit = Pick<OperationOf<"part.fitted">, "id" | "workOrderId" | "authorId"> & {
  payload: Pick<OperationOf<"part.fitted">["payload"], "partFittedId" | "partNumber" | "serial" | "batch" | "quantity">;
};

export interface StockDraw {
  fit: Fit;
  itemId: string;
  plan: DrawPlan;
  /** The flag for the supervisor, or null when it drew cleanly. */
  reason: string | null;
}

/**
 * Plans the draw of each fit (in the order given: the merge's stamp order) of a part the shop keeps
 * in stock. Fits of parts not kept in stock draw nothing and are not in the answer.
 */
export async function planStockDraws(trx: Tx, shopId: string, fits: readonly Fit[]): Promise<Map<string, StockDraw>> {
  const out = new Map<string, StockDraw>();
  if (!fits.length) return out;
  const keys = [...new Set(fits.map((f) => plainCode(f.payload.partNumber)))];
  const items = await trx
    .selectFrom("stock_items")
    .select(["id", "part_key"])
    .where("shop_id", "=", shopId)
    .where("part_key", "in", keys)
    .execute();
  const itemOf = new Map(items.map((i) => [i.part_key, i.id]));
  const lots = await lockedLots(trx, { shopId, itemIds: items.map((i) => i.id) });
  for (const fit of fits) {
    const p = fit.payload;
    const itemId = itemOf.get(plainCode(p.partNumber));
    if (!itemId) continue;
    const ofItem = lots.filter((l) => l.itemId === itemId);
    const bySerial = p.serial ? ofItem.filter((l) => l.serialKey === plainCode(p.serial!)) : [];
    const matching = bySerial.length ? bySerial : p.batch ? ofItem.filter((l) => l.batchKey === plainCode(p.batch!)) : [];
    const plan = planDraw(matching, fit.workOrderId, p.quantity);
    out.set(fit.id, { fit, itemId, plan, reason: stockFlagReason(p, plan, matching.length) });
  }
  return out;
}

/**
 * Writes the planned draws of the fits stored: the lots' balances (one UPDATE) and one "drawn"
 * movement per lot taken from, the shortfall on the last (or on a movement of its own, with no lot,
 * when nothing could be drawn).
 */
export async function writeStockDraws(trx: Tx, shopId: string, draws: readonly StockDraw[]): Promise<void> {
  if (!draws.length) return;
  const movements = draws.flatMap(({ fit, itemId, plan }): Array<Insertable<Database["stock_movements"]>> => {
    const base = {
      shop_id: shopId,
      item_id: itemId,
      kind: "drawn" as const,
      work_order_id: fit.workOrderId,
      part_fitted_id: fit.payload.partFittedId,
      recorded_by: fit.authorId,
    };
    if (!plan.draws.length) return [{ ...base, lot_id: null, quantity: 0, reserved_used: 0, short: plan.short }];
    return plan.draws.map((d, i) => ({
      ...base,
      lot_id: d.lotId,
      quantity: d.quantity,
      reserved_used: d.reservedUsed,
      short: i === plan.draws.length - 1 ? plan.short : 0,
    }));
  });
  const perLot = new Map<string, { taken: number; used: number }>();
  for (const m of movements) {
    if (!m.lot_id) continue;
    const t = perLot.get(m.lot_id) ?? { taken: 0, used: 0 };
    t.taken += m.quantity;
    t.used += m.reserved_used ?? 0;
    perLot.set(m.lot_id, t);
  }
  if (perLot.size) {
    const rows = [...perLot].map(([id, t]) => ({ id, ...t }));
    await sql`
      UPDATE stock_lots l SET on_hand = l.on_hand - x.taken, reserved = l.reserved - x.used
      FROM json_to_recordset(${JSON.stringify(rows)}::json) AS x(id uuid, taken int, used int)
      WHERE l.id = x.id
    `.execute(trx);
  }
  await trx.insertInto("stock_movements").values(movements).execute();
}

/** A part fit withdrawn at the bench: the fit's operation, the withdrawal's reason and who made it. */
export interface FitWithdrawal {
  fitOperationId: string;
  reason: string;
  by: string;
}

/**
 * Puts back what withdrawn fits drew: a fit withdrawn was recorded by mistake, so the part never
 * left the shelf. Each lot drawn from gets its quantity back on hand, and what the draw took from
 * the job's reservation is put aside for the job again, by one "returned" movement per draw,
 * pointing at it (a draw is put back once: releases_id is unique). A draw the shelf could not cover
 * (short) puts back only what it took. Runs in the merge's transaction, before the batch's own
 * fits draw, so a part withdrawn from one job and fitted to another in the same batch is there.
 */
export async function returnWithdrawnDraws(trx: Tx, shopId: string, withdrawals: readonly FitWithdrawal[]): Promise<void> {
  if (!withdrawals.length) return;
  const byFit = new Map(withdrawals.map((w) => [w.fitOperationId, w]));
  const draws = await trx
    .selectFrom("stock_movements as m")
    .innerJoin("parts_fitted as p", "p.id", "m.part_fitted_id")
    .select(["m.id", "m.item_id", "m.lot_id", "m.quantity", "m.reserved_used", "m.work_order_id", "m.part_fitted_id", "p.operation_id"])
    .where("m.shop_id", "=", shopId)
    .where("m.kind", "=", "drawn")
    .where("m.lot_id", "is not", null)
    .where("m.quantity", ">", 0)
    .where("p.operation_id", "in", [...byFit.keys()])
    .where((eb) => eb.not(eb.exists(eb.selectFrom("stock_movements as r").select("r.id").whereRef("r.releases_id", "=", "m.id"))))
    .orderBy("m.id")
    .execute();
  if (!draws.length) return;
  const perLot = new Map<string, { back: number; aside: number }>();
  for (const d of draws) {
    const t = perLot.get(d.lot_id!) ?? { back: 0, aside: 0 };
    t.back += d.quantity;
    t.aside += d.reserved_used;
    perLot.set(d.lot_id!, t);
  }
  const rows = [...perLot].sort(([a], [b]) => (a < b ? -1 : 1)).map(([id, t]) => ({ id, ...t }));
  await lockLots(
    trx,
    rows.map((r) => r.id),
  );
  await sql`
    UPDATE stock_lots l SET on_hand = l.on_hand + x.back, reserved = l.reserved + x.aside
    FROM json_to_recordset(${JSON.stringify(rows)}::json) AS x(id uuid, back int, aside int)
    WHERE l.id = x.id
  `.execute(trx);
  await trx
    .insertInto("stock_movements")
    .values(
      draws.map((d) => {
        const w = byFit.get(d.operation_id!)!;
        return {
          shop_id: shopId,
          item_id: d.item_id,
          lot_id: d.lot_id,
          kind: "returned" as const,
          quantity: d.quantity,
          reserved_used: d.reserved_used,
          work_order_id: d.work_order_id,
          part_fitted_id: d.part_fitted_id,
          releases_id: d.id,
          reason: `Fit withdrawn at the bench: ${w.reason}`.slice(0, 500),
          recorded_by: w.by,
        };
      }),
    )
    .execute();
}
