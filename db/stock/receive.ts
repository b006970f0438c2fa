import "server-only";
import { dayIn } from "@/lib/aftercare/reminders";
import type { Kysely, Transaction } from "kysely";
import { DatabaseError } from "pg";
import type { SessionUser } from "@/lib/auth/session-user";
import { Refusal, type FieldIssue } from "@/lib/errors";
import { deliverySchema, type DeliveryLine } from "@/lib/stock/input";
import { plainCode } from "@/lib/sync/parts";
import { appendAudit } from "../audit/append";
import type { Database } from "../schema";
import { shopTimeZone } from "../shop/settings";

// Receiving a delivery: every line becomes a lot on the shelf with its batch or serial number, and
// a "received" movement. All lines are saved or none: a bad line (a serial number already on file,
// the same serial twice in the delivery) refuses the delivery with each reason, nothing half-saved.

const UNIQUE_VIOLATION = "23505";

type Tx = Transaction<Database>;

/** Serial numbers of the delivery that are already on file: in stock (ever received) or fitted. */
async function serialsOnFile(trx: Tx, shopId: string, lines: readonly DeliveryLine[]): Promise<FieldIssue[]> {
  const wanted = lines.flatMap((l, i) => (l.serial ? [{ i, l, part: plainCode(l.partNumber), serial: plainCode(l.serial) }] : []));
  if (!wanted.length) return [];
  const issues: FieldIssue[] = [];
  const seen = new Map<string, number>();
  for (const w of wanted) {
    const key = `${w.part}\u0000${w.serial}`;
    const first = seen.get(key);
    if (first !== undefined)
      issues.push({
        path: `lines.${w.i}.serial`,
        message: `Serial number ${w.l.serial} of part ${w.l.partNumber} is on line ${first + 1} of this delivery already: a serial number names one part.`,
      });
    else seen.set(key, w.i);
  }
  const timeZone = await shopTimeZone(trx, shopId);
  const [lots, fitted] = await Promise.all([
    trx
      .selectFrom("stock_lots as l")
      .innerJoin("stock_items as i", "i.id", "l.item_id")
      .innerJoin("stock_deliveries as d", "d.id", "l.delivery_id")
      .select(["i.part_key as partKey", "l.serial_key as serialKey", "d.supplier", "d.received_at as receivedAt"])
      .where("l.shop_id", "=", shopId)
      .where(
        "l.serial_key",
        "in",
        wanted.map((w) => w.serial),
      )
      .execute(),
    trx
      .selectFrom("parts_fitted as p")
      .innerJoin("work_orders as w", "w.id", "p.work_order_id")
      .select(["p.part_number as partNumber", "p.serial", "w.number"])
      .where("p.shop_id", "=", shopId)
      .where("p.serial", "is not", null)
      .where((eb) =>
        eb(
          eb.fn("lower", ["p.serial"]),
          "in",
          wanted.map((w) => w.l.serial!.toLowerCase()),
        ),
      )
      .execute(),
  ]);
  for (const w of wanted) {
    const lot = lots.find((r) => r.partKey === w.part && r.serialKey === w.serial);
    const fit = fitted.find((r) => plainCode(r.partNumber) === w.part && plainCode(r.serial!) === w.serial);
    if (lot)
      issues.push({
        path: `lines.${w.i}.serial`,
        message: `Serial number ${w.l.serial} of part ${w.l.partNumber} is already on file: received from ${lot.supplier} on ${dayIn(timeZone, lot.receivedAt)}.`,
      });
    else if (fit)
      issues.push({
        path: `lines.${w.i}.serial`,
        message: `Serial number ${w.l.serial} of part ${w.l.partNumber} is already on file: fitted on work order #${fit.number}.`,
      });
  }
  return issues;
}

/** The stock item of each part number of the delivery, created when new (first description wins). */
async function itemsFor(trx: Tx, user: SessionUser, lines: readonly DeliveryLine[]): Promise<Map<string, string>> {
  const byKey = new Map<string, DeliveryLine>();
  for (const l of lines) if (!byKey.has(plainCode(l.partNumber))) byKey.set(plainCode(l.partNumber), l);
  await trx
    .insertInto("stock_items")
    .values(
      [...byKey].map(([key, l]) => ({
        shop_id: user.shopId,
        part_number: l.partNumber,
        part_key: key,
        description: l.description,
        created_by: user.id,
      })),
    )
    .onConflict((oc) => oc.columns(["shop_id", "part_key"]).doNothing())
    .execute();
  const rows = await trx
    .selectFrom("stock_items")
    .select(["id", "part_key"])
    .where("shop_id", "=", user.shopId)
    .where("part_key", "in", [...byKey.keys()])
    .execute();
  return new Map(rows.map((r) => [r.part_key, r.id]));
}

/** Low-stock levels the delivery sets: a new row only where the level given differs from the current one. */
async function setLevels(trx: Tx, user: SessionUser, lines: readonly DeliveryLine[], items: ReadonlyMap<string, string>) {
  const wanted = new Map<string, number>();
  for (const l of lines) if (l.lowStockAt !== undefined) wanted.set(items.get(plainCode(l.partNumber))!, l.lowStockAt);
  if (!wanted.size) return;
  const current = await trx
    .selectFrom("stock_levels")
    .select(["item_id", "low_at"])
    .distinctOn("item_id")
    .where("item_id", "in", [...wanted.keys()])
    .orderBy("item_id")
    .orderBy("set_at", "desc")
    .orderBy("id", "desc")
    .execute();
  const now = new Map(current.map((c) => [c.item_id, c.low_at]));
  const rows = [...wanted].filter(([id, at]) => now.get(id) !== at);
  if (rows.length)
    await trx
      .insertInto("stock_levels")
      .values(rows.map(([item_id, low_at]) => ({ shop_id: user.shopId, item_id, low_at, set_by: user.id })))
      .execute();
}

/** Receives a delivery; refused with every line's reason (and nothing saved) when any line is bad. */
export async function receiveDelivery(db: Kysely<Database>, user: SessionUser, input: unknown) {
  const d = deliverySchema.parse(input);
  try {
    return await db.transaction().execute(async (trx) => {
      const issues = await serialsOnFile(trx, user.shopId, d.lines);
      if (issues.length)
        throw new Refusal(issues.length === 1 ? issues[0].message : "Some lines cannot be received: nothing was saved.", 422, issues);
      const delivery = await trx
        .insertInto("stock_deliveries")
        .values({ shop_id: user.shopId, supplier: d.supplier, reference: d.reference, received_by: user.id })
        .returning(["id", "received_at as receivedAt"])
        .executeTakeFirstOrThrow();
      const items = await itemsFor(trx, user, d.lines);
      await setLevels(trx, user, d.lines, items);
      const lots = await trx
        .insertInto("stock_lots")
        .values(
          d.lines.map((l) => ({
            shop_id: user.shopId,
            item_id: items.get(plainCode(l.partNumber))!,
            delivery_id: delivery.id,
            location: l.location,
            batch: l.batch ?? null,
            batch_key: l.batch ? plainCode(l.batch) : null,
            serial: l.serial ?? null,
            serial_key: l.serial ? plainCode(l.serial) : null,
            received_qty: l.quantity,
            on_hand: l.quantity,
            received_at: delivery.receivedAt,
          })),
        )
        .returning(["id", "item_id", "received_qty"])
        .execute();
      await trx
        .insertInto("stock_movements")
        .values(
          lots.map((l) => ({
            shop_id: user.shopId,
            item_id: l.item_id,
            lot_id: l.id,
            kind: "received" as const,
            quantity: l.received_qty,
            recorded_by: user.id,
          })),
        )
        .execute();
      await appendAudit(trx, [
        {
          shopId: user.shopId,
          actorId: user.id,
          action: "stock.received",
          entity: "stock_delivery",
          entityId: delivery.id,
          outcome: "accepted",
          detail: { supplier: d.supplier, reference: d.reference, lines: d.lines.length },
        },
      ]);
      return { id: delivery.id, lots: lots.map((l) => l.id) };
    });
  } catch (e) {
    // Two deliveries with the same serial number at once: the unique index refuses the second.
    if (e instanceof DatabaseError && e.code === UNIQUE_VIOLATION && e.constraint === "stock_lots_serial_once")
      throw new Refusal(
        "A serial number of this delivery was received a moment ago by someone else: nothing was saved. Check the lines and try again.",
        409,
      );
    throw e;
  }
}
