import "server-only";
import { sql, type Insertable, type Transaction } from "kysely";
import { planDraw, stockFlagReason, type DrawPlan } from "@/lib/stock/draw";
import type { OperationOf } from "@/lib/sync/operations";
import { plainCode } from "@/lib/sync/parts";
import type { Database } from "../schema";
import { lockedLots } from "./balances";

// Parts fitted at the bench draw from stock, in the merge's transaction. A fit is never refused or
// lost for stock: it is recorded, the draw stops at zero (the lots' CHECK (on_hand >= 0) would
// refuse more), and what the shelf could not cover is counted on the movement and flagged for the
// supervisor. Merges of a shop run one at a time and the lots are locked FOR UPDATE, so two
// tablets fitting the last one are decided one after the other: the second is the short one.

type Tx = Transaction<Database>;
type Fit = OperationOf<"part.fitted">;

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
