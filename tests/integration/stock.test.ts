import { randomUUID } from "node:crypto";
import { sql } from "kysely";
import { lockedLots } from "@/db/stock/balances";
import { describe, expect, it } from "vitest";
import { POST as deliveriesRoute } from "@/app/api/office/stock/deliveries/route";
import { POST as officePartsRoute } from "@/app/api/office/work-orders/[id]/parts/route";
import { POST as releaseRoute } from "@/app/api/office/stock/reservations/[id]/release/route";
import { POST as reservationsRoute } from "@/app/api/office/stock/reservations/route";
import { GET as searchRoute } from "@/app/api/office/stock/search/route";
import { GET as stockRoute } from "@/app/api/office/stock/route";
import { bikesWithPart } from "@/db/office/parts";
import { flaggedEntriesOf } from "@/db/review/flagged-work";
import { mergeBatch } from "@/db/sync/merge";
import type { SessionUser } from "@/lib/auth/session-user";
import type { OperationOf } from "@/lib/sync/operations";
import { Tablet } from "../bench/sync-ops";
import { appRequest } from "./support/route-calls";
import { createShopFixture, type ShopFixture } from "./support/shop-fixture";
import { useTestDb } from "./support/test-db";

// Stock on real PostgreSQL: deliveries received (bad ones refused whole), parts put aside for a job
// and let go, fits at the bench drawing from stock in the merge — never below zero, even when two
// tablets fit the last one at once — and the batch search across received, put aside and fitted.

const db = useTestDb();
const asUser = (u: ShopFixture["users"]["mechanic"]): SessionUser => ({ ...u, customerId: null });

const post = (path: string, body: unknown) =>
  appRequest(path, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(body) });

async function setup() {
  const fx = await createShopFixture(db);
  const office = asUser(fx.users.office);
  const stepId = fx.stepByKey["rod-bolts"].id;
  return { fx, office, stepId };
}

async function receive(office: SessionUser, body: unknown) {
  const res = await deliveriesRoute.handle(post("/api/office/stock/deliveries", body), { user: office, db });
  return {
    status: res.status,
    body: (await res.json()) as { id?: string; lots?: string[]; error?: string; issues?: Array<{ path: string; message: string }> },
  };
}

const rodBolts = (over: Record<string, unknown> = {}) => ({
  partNumber: "GS-RB-8",
  description: "Rod bolt",
  location: "Shelf B2",
  batch: "L24-118",
  quantity: 8,
  lowStockAt: 4,
  ...over,
});

type PartPayload = OperationOf<"part.fitted">["payload"];
const fitBolts = (stepId: string, over: Partial<PartPayload> = {}): PartPayload => ({
  partFittedId: randomUUID(),
  stepId,
  partNumber: "GS-RB-8",
  description: "Rod bolt",
  batch: "L24-118",
  quantity: 1,
  ...over,
});

const lot = (id: string) => db.selectFrom("stock_lots").select(["on_hand", "reserved"]).where("id", "=", id).executeTakeFirstOrThrow();
const counts = async (shopId: string) => ({
  deliveries: Number(
    (await sql<{ n: string }>`SELECT count(*) AS n FROM stock_deliveries WHERE shop_id = ${shopId}`.execute(db)).rows[0].n,
  ),
  lots: Number((await sql<{ n: string }>`SELECT count(*) AS n FROM stock_lots WHERE shop_id = ${shopId}`.execute(db)).rows[0].n),
  movements: Number((await sql<{ n: string }>`SELECT count(*) AS n FROM stock_movements WHERE shop_id = ${shopId}`.execute(db)).rows[0].n),
});

describe("receiving a delivery", () => {
  it("puts each line on the shelf as a lot with its batch or serial number, and records the receipt", async () => {
    const { fx, office } = await setup();
    const res = await receive(office, {
      supplier: "Harbour Pistons",
      reference: "DN-5521",
      lines: [rodBolts(), { partNumber: "GS-PST-7600", description: "Forged piston", location: "Cage 1", serial: "GS-0042", quantity: 1 }],
    });
    expect(res.status).toBe(201);
    expect(res.body.lots).toHaveLength(2);
    const page = await (await stockRoute.handle(appRequest("/api/office/stock"), { user: office, db })).json();
    expect(
      page.lots.map((l: { partNumber: string; location: string; onHand: number; batch: string | null; serial: string | null }) => [
        l.partNumber,
        l.location,
        l.onHand,
        l.batch,
        l.serial,
      ]),
    ).toEqual([
      ["GS-PST-7600", "Cage 1", 1, null, "GS-0042"],
      ["GS-RB-8", "Shelf B2", 8, "L24-118", null],
    ]);
    expect(await counts(fx.shopId)).toEqual({ deliveries: 1, lots: 2, movements: 2 });
  });

  it("refuses a negative or zero quantity with the field and the rule, and saves nothing", async () => {
    const { fx, office } = await setup();
    for (const quantity of [-3, 0, 1.5]) {
      const res = await receive(office, { supplier: "Harbour Pistons", lines: [rodBolts({ quantity })] });
      expect(res.status).toBe(400);
      const issue = res.body.issues!.find((i) => i.path === "lines.0.quantity");
      expect(issue?.message).toMatch(/^Quantity (must be at least 1: a delivery cannot take stock away|must be a whole number)/);
    }
    expect(await counts(fx.shopId)).toEqual({ deliveries: 0, lots: 0, movements: 0 });
  });

  it("refuses a serial number already on file (received, or twice in the delivery) naming it, and saves none of the delivery", async () => {
    const { fx, office } = await setup();
    const piston = (serial: string) => ({
      partNumber: "GS-PST-7600",
      description: "Forged piston",
      location: "Cage 1",
      serial,
      quantity: 1,
    });
    expect((await receive(office, { supplier: "Harbour Pistons", lines: [piston("GS-0042")] })).status).toBe(201);
    const before = await counts(fx.shopId);
    // the same serial spelt another way, beside a good line: the whole delivery is refused
    const again = await receive(office, { supplier: "Harbour Pistons", lines: [rodBolts(), piston("gs 0042")] });
    expect(again.status).toBe(422);
    expect(again.body.error).toMatch(
      /^Serial number gs 0042 of part GS-PST-7600 is already on file: received from Harbour Pistons on \d{4}-\d{2}-\d{2}\.$/,
    );
    expect(again.body.issues).toEqual([{ path: "lines.1.serial", message: again.body.error }]);
    const twice = await receive(office, { supplier: "Harbour Pistons", lines: [piston("GS-0077"), piston("GS-0077")] });
    expect(twice.status).toBe(422);
    expect(twice.body.issues![0]).toEqual({
      path: "lines.1.serial",
      message: "Serial number GS-0077 of part GS-PST-7600 is on line 1 of this delivery already: a serial number names one part.",
    });
    expect(await counts(fx.shopId)).toEqual(before);
  });

  it("refuses a serial number already fitted on a job (recorded before stock was kept)", async () => {
    const { fx, office, stepId } = await setup();
    const mech = asUser(fx.users.mechanic);
    const tablet = new Tablet(`tab-${randomUUID().slice(0, 6)}`, mech.id, fx.workOrderId);
    await mergeBatch(
      db,
      mech,
      tablet.batch([tablet.make("part.fitted", fitBolts(stepId, { partNumber: "GS-PST-7600", serial: "GS-0099", batch: undefined }))]),
    );
    const res = await receive(office, {
      supplier: "Harbour Pistons",
      lines: [{ partNumber: "GS-PST-7600", location: "Cage 1", serial: "GS-0099", quantity: 1 }],
    });
    expect(res.status).toBe(422);
    expect(res.body.error).toBe(`Serial number GS-0099 of part GS-PST-7600 is already on file: fitted on work order #${1}.`);
  });
});

describe("lots are drawn oldest first, locked in one order", () => {
  it("lockedLots gives the item's lots in the order they were received, whatever their ids", async () => {
    const { fx, office } = await setup();
    const received: string[] = [];
    // six deliveries of the same part: their random ids are almost surely not in the order received
    for (let i = 0; i < 6; i++)
      received.push((await receive(office, { supplier: "Harbour Pistons", lines: [rodBolts({ batch: `L-${i}` })] })).body.lots![0]);
    const [{ item_id }] = await db.selectFrom("stock_lots").select("item_id").where("id", "=", received[0]).execute();
    const lots = await db.transaction().execute((trx) => lockedLots(trx, { shopId: fx.shopId, itemIds: [item_id] }));
    expect(lots.map((l) => l.id)).toEqual(received);
    expect(lots[0]).not.toHaveProperty("receivedAt");
  });
});

describe("the database itself refuses negative stock", () => {
  it("CHECK (on_hand >= 0) on the lot, and the lot's identity cannot change", async () => {
    const { office } = await setup();
    const { body } = await receive(office, { supplier: "Harbour Pistons", lines: [rodBolts({ quantity: 1 })] });
    await expect(sql`UPDATE stock_lots SET on_hand = on_hand - 2 WHERE id = ${body.lots![0]}`.execute(db)).rejects.toThrow(
      /stock_lots_on_hand_check/,
    );
    await expect(sql`UPDATE stock_lots SET batch = 'X' WHERE id = ${body.lots![0]}`.execute(db)).rejects.toThrow(/only the balances/);
    await expect(sql`DELETE FROM stock_movements`.execute(db)).rejects.toThrow(/append-only/);
    expect(await lot(body.lots![0])).toEqual({ on_hand: 1, reserved: 0 });
  });
});

describe("fitting at the bench draws from stock", () => {
  it("a fit takes what it used from the lot of its batch; resending the batch draws nothing more", async () => {
    const { fx, office, stepId } = await setup();
    const { body } = await receive(office, { supplier: "Harbour Pistons", lines: [rodBolts()] });
    const mech = asUser(fx.users.mechanic);
    const tablet = new Tablet(`tab-${randomUUID().slice(0, 6)}`, mech.id, fx.workOrderId);
    const batch = tablet.batch([tablet.make("part.fitted", fitBolts(stepId, { quantity: 3, batch: "l24 118" }))]);
    const first = await mergeBatch(db, mech, batch);
    expect(first.flagged).toEqual([]);
    expect(await lot(body.lots![0])).toEqual({ on_hand: 5, reserved: 0 });
    const again = await mergeBatch(db, mech, batch);
    expect(again.duplicates).toHaveLength(1);
    expect(await lot(body.lots![0])).toEqual({ on_hand: 5, reserved: 0 });
  });

  it("two tablets fitting the last one at once: never below zero, both fits recorded, the second flagged", async () => {
    const { fx, office, stepId } = await setup();
    const { body } = await receive(office, { supplier: "Harbour Pistons", lines: [rodBolts({ quantity: 1 })] });
    const mech = asUser(fx.users.mechanic);
    const sup = asUser(fx.users.supervisor);
    const a = new Tablet(`tab-a-${randomUUID().slice(0, 6)}`, mech.id, fx.workOrderId);
    const b = new Tablet(`tab-b-${randomUUID().slice(0, 6)}`, sup.id, fx.workOrderId);
    const opA = a.make("part.fitted", fitBolts(stepId));
    const opB = b.make("part.fitted", fitBolts(stepId));
    const [ra, rb] = await Promise.all([mergeBatch(db, mech, a.batch([opA])), mergeBatch(db, sup, b.batch([opB]))]);
    expect([...ra.accepted, ...rb.accepted].sort()).toEqual([opA.id, opB.id].sort());
    const flagged = [...ra.flagged, ...rb.flagged];
    expect(flagged).toHaveLength(1);
    expect(flagged[0].reason).toBe(
      "Stock short: 1 of part GS-RB-8 batch L24-118 fitted but only 0 left on the shelf as recorded. The fit is kept and stock stays at 0: count the shelf and check who else fitted this batch.",
    );
    expect(await lot(body.lots![0])).toEqual({ on_hand: 0, reserved: 0 });
    const parts = await db.selectFrom("parts_fitted").select("id").where("work_order_id", "=", fx.workOrderId).execute();
    expect(parts).toHaveLength(2);
    const ops = await db.selectFrom("operations").select(["id", "flagged", "flag_reason"]).where("id", "in", [opA.id, opB.id]).execute();
    expect(ops.filter((o) => o.flagged).map((o) => o.flag_reason)).toEqual([flagged[0].reason]);
    // the supervisor's review lists it with its reason
    const review = (await flaggedEntriesOf(db, fx.shopId, [fx.workOrderId])).get(fx.workOrderId) ?? [];
    expect(review.map((e) => e.flagReason)).toEqual([flagged[0].reason]);
    const page = await (await stockRoute.handle(appRequest("/api/office/stock"), { user: office, db })).json();
    expect(page.shortfalls).toMatchObject([{ partNumber: "GS-RB-8", batch: "L24-118", fitted: 1, short: 1, workOrderNumber: 1 }]);
    expect(page.low).toMatchObject([{ partNumber: "GS-RB-8", onHand: 0, free: 0, lowAt: 4 }]);
  });

  it("many tablets fitting at once never take the lot below zero; every fit is recorded and the short ones flagged", async () => {
    const { fx, office, stepId } = await setup();
    const { body } = await receive(office, { supplier: "Harbour Pistons", lines: [rodBolts({ quantity: 5 })] });
    const mech = asUser(fx.users.mechanic);
    const tablets = Array.from({ length: 6 }, (_, i) => new Tablet(`tab-${i}-${randomUUID().slice(0, 6)}`, mech.id, fx.workOrderId));
    const results = await Promise.all(
      tablets.map((t) => mergeBatch(db, mech, t.batch([t.make("part.fitted", fitBolts(stepId, { quantity: 2 }))]))),
    );
    expect(results.flatMap((r) => r.accepted)).toHaveLength(6);
    expect(await lot(body.lots![0])).toEqual({ on_hand: 0, reserved: 0 });
    const moves = await db
      .selectFrom("stock_movements")
      .select(["quantity", "short"])
      .where("kind", "=", "drawn")
      .where("shop_id", "=", fx.shopId)
      .execute();
    expect(moves.reduce((s, m) => s + m.quantity, 0)).toBe(5);
    expect(moves.reduce((s, m) => s + m.short, 0)).toBe(7);
    // 2 + 2 drawn whole; the third takes the last one and is 1 short; three more find nothing
    expect(results.flatMap((r) => r.flagged)).toHaveLength(4);
  });

  it("a fit of a stocked part whose batch was never received is kept and flagged; a part not kept in stock draws nothing", async () => {
    const { fx, office, stepId } = await setup();
    await receive(office, { supplier: "Harbour Pistons", lines: [rodBolts()] });
    const mech = asUser(fx.users.mechanic);
    const tablet = new Tablet(`tab-${randomUUID().slice(0, 6)}`, mech.id, fx.workOrderId);
    const unknownBatch = tablet.make("part.fitted", fitBolts(stepId, { batch: "L99-000" }));
    const notStocked = tablet.make("part.fitted", fitBolts(stepId, { partNumber: "ACME-GASKET", batch: "G1" }));
    const res = await mergeBatch(db, mech, tablet.batch([unknownBatch, notStocked]));
    expect(res.accepted).toHaveLength(2);
    expect(res.flagged).toEqual([
      {
        id: unknownBatch.id,
        reason:
          "Stock: part GS-RB-8 batch L99-000 was never received into stock, so nothing was drawn. The fit is kept: check where the part came from and receive it if it is ours.",
      },
    ]);
  });
});

describe("putting stock aside for a job", () => {
  it("reserves free stock to a job, refuses more than is free, lets the rest go with a reason, and the job's fit uses its reservation", async () => {
    const { fx, office, stepId } = await setup();
    const { body } = await receive(office, { supplier: "Harbour Pistons", lines: [rodBolts({ quantity: 4 })] });
    const lotId = body.lots![0];
    const reserve = (quantity: number) =>
      reservationsRoute.handle(post("/api/office/stock/reservations", { lotId, workOrderNumber: 1, quantity }), { user: office, db });
    const r = await reserve(3);
    expect(r.status).toBe(201);
    const reservationId = ((await r.json()) as { id: string }).id;
    expect(await lot(lotId)).toEqual({ on_hand: 4, reserved: 3 });
    const tooMany = await reserve(2);
    expect(tooMany.status).toBe(409);
    expect(((await tooMany.json()) as { error: string }).error).toBe(
      "Only 1 of part GS-RB-8 batch L24-118 is free (4 on the shelf, 3 put aside already).",
    );

    const mech = asUser(fx.users.mechanic);
    const tablet = new Tablet(`tab-${randomUUID().slice(0, 6)}`, mech.id, fx.workOrderId);
    await mergeBatch(db, mech, tablet.batch([tablet.make("part.fitted", fitBolts(stepId, { quantity: 2 }))]));
    expect(await lot(lotId)).toEqual({ on_hand: 2, reserved: 1 });

    const noReason = await releaseRoute.handle(post(`/api/office/stock/reservations/${reservationId}/release`, { reason: "" }), {
      user: office,
      db,
      params: { id: reservationId },
    });
    expect(noReason.status).toBe(400);
    expect(await noReason.json()).toMatchObject({ issues: [{ path: "reason", message: "Reason: say why, at least 3 characters." }] });
    const rel = await releaseRoute.handle(
      post(`/api/office/stock/reservations/${reservationId}/release`, { reason: "Customer brought his own" }),
      {
        user: office,
        db,
        params: { id: reservationId },
      },
    );
    expect(rel.status).toBe(200);
    expect(await rel.json()).toMatchObject({ quantity: 1 });
    expect(await lot(lotId)).toEqual({ on_hand: 2, reserved: 0 });
    const twice = await releaseRoute.handle(post(`/api/office/stock/reservations/${reservationId}/release`, { reason: "again" }), {
      user: office,
      db,
      params: { id: reservationId },
    });
    expect(twice.status).toBe(409);
  });
});

describe("a part the office records", () => {
  it("draws from stock as a bench fit does, from the job's reservation first; past the shelf it is kept and the shortfall said", async () => {
    const { fx, office } = await setup();
    const { body } = await receive(office, { supplier: "Harbour Pistons", lines: [rodBolts({ quantity: 4 })] });
    const lotId = body.lots![0];
    await reservationsRoute.handle(post("/api/office/stock/reservations", { lotId, workOrderNumber: 1, quantity: 2 }), {
      user: office,
      db,
    });
    const record = (quantity: number) =>
      officePartsRoute.handle(
        post(`/api/office/work-orders/${fx.workOrderId}/parts`, {
          partNumber: "gs-rb-8",
          description: "Rod bolt",
          batch: "L24-118",
          quantity,
        }),
        { user: office, db, params: { id: fx.workOrderId } },
      );
    const first = await record(3);
    expect(first.status).toBe(201);
    expect(await first.json()).toMatchObject({ stockNote: null });
    expect(await lot(lotId)).toEqual({ on_hand: 1, reserved: 0 });
    const second = await record(2);
    expect(second.status).toBe(201);
    expect(((await second.json()) as { stockNote: string }).stockNote).toMatch(
      /^Stock short: 2 of part gs-rb-8 batch L24-118 fitted but only 1 left/,
    );
    expect(await lot(lotId)).toEqual({ on_hand: 0, reserved: 0 });
    const parts = await db.selectFrom("parts_fitted").select("quantity").where("work_order_id", "=", fx.workOrderId).execute();
    expect(parts.map((p) => p.quantity).sort()).toEqual([2, 3]);
  });
});

describe("a fit withdrawn at the bench", () => {
  const withdraw = (tablet: Tablet, operationId: string, reason = "Recorded against the wrong job") =>
    tablet.make("entry.withdrawn", { operationId, reason });

  it("puts back what it drew and what it used of the job's reservation; the search shows it put back, not fitted", async () => {
    const { fx, office, stepId } = await setup();
    const { body } = await receive(office, { supplier: "Harbour Pistons", lines: [rodBolts({ quantity: 4 })] });
    const lotId = body.lots![0];
    await reservationsRoute.handle(post("/api/office/stock/reservations", { lotId, workOrderNumber: 1, quantity: 3 }), {
      user: office,
      db,
    });
    const mech = asUser(fx.users.mechanic);
    const tablet = new Tablet(`tab-${randomUUID().slice(0, 6)}`, mech.id, fx.workOrderId);
    const fit = tablet.make("part.fitted", fitBolts(stepId, { quantity: 2 }));
    await mergeBatch(db, mech, tablet.batch([fit]));
    expect(await lot(lotId)).toEqual({ on_hand: 2, reserved: 1 });
    const w = withdraw(tablet, fit.id);
    const r = await mergeBatch(db, mech, tablet.batch([w]));
    expect(r.accepted).toEqual([w.id]);
    expect(await lot(lotId)).toEqual({ on_hand: 4, reserved: 3 });
    const moves = await db
      .selectFrom("stock_movements")
      .select(["kind", "quantity", "reserved_used", "reason"])
      .where("lot_id", "=", lotId)
      .where("kind", "in", ["drawn", "returned"])
      .orderBy("recorded_at")
      .execute();
    expect(moves).toEqual([
      { kind: "drawn", quantity: 2, reserved_used: 2, reason: null },
      { kind: "returned", quantity: 2, reserved_used: 2, reason: "Fit withdrawn at the bench: Recorded against the wrong job" },
    ]);
    // the same withdrawal sent again puts back nothing more
    await mergeBatch(db, mech, tablet.batch([w]));
    expect(await lot(lotId)).toEqual({ on_hand: 4, reserved: 3 });
    const res = await searchRoute.handle(appRequest("/api/office/stock/search?code=L24-118"), { user: office, db });
    const { events } = (await res.json()) as { events: Array<{ event: string; quantity: number }> };
    expect(events.map((e) => [e.event, e.quantity])).toEqual([
      ["received", 4],
      ["reserved", 3],
      ["returned", 2],
    ]);
    // the recall search by batch does not name the bike either: it never got the bolts
    expect(await bikesWithPart(db, fx.shopId, "L24-118")).toEqual([]);
  });

  it("a serial number withdrawn and fitted again in the next batch is there to draw: no shortfall flagged", async () => {
    const { fx, office, stepId } = await setup();
    const piston = { partNumber: "GS-PST-7600", description: "Forged piston", location: "Cage 1", serial: "GS-0911", quantity: 1 };
    const { body } = await receive(office, { supplier: "Harbour Pistons", lines: [piston] });
    const lotId = body.lots![0];
    const mech = asUser(fx.users.mechanic);
    const tablet = new Tablet(`tab-${randomUUID().slice(0, 6)}`, mech.id, fx.workOrderId);
    const fitPiston = () =>
      tablet.make("part.fitted", {
        partFittedId: randomUUID(),
        stepId,
        partNumber: "GS-PST-7600",
        description: "Forged piston",
        serial: "GS-0911",
        quantity: 1,
      });
    const first = fitPiston();
    await mergeBatch(db, mech, tablet.batch([first]));
    expect(await lot(lotId)).toEqual({ on_hand: 0, reserved: 0 });
    const w = withdraw(tablet, first.id, "Fitted to the wrong cylinder on the sheet");
    const again = fitPiston();
    const r = await mergeBatch(db, mech, tablet.batch([w, again]));
    expect(r.accepted.sort()).toEqual([w.id, again.id].sort());
    expect(r.flagged).toEqual([]);
    expect(await lot(lotId)).toEqual({ on_hand: 0, reserved: 0 });
    const shorts = await db.selectFrom("stock_movements").select("id").where("lot_id", "=", lotId).where("short", ">", 0).execute();
    expect(shorts).toEqual([]);
  });

  it("a fit made and withdrawn within one batch draws nothing", async () => {
    const { fx, office, stepId } = await setup();
    const { body } = await receive(office, { supplier: "Harbour Pistons", lines: [rodBolts({ quantity: 4 })] });
    const mech = asUser(fx.users.mechanic);
    const tablet = new Tablet(`tab-${randomUUID().slice(0, 6)}`, mech.id, fx.workOrderId);
    const fit = tablet.make("part.fitted", fitBolts(stepId, { quantity: 4 }));
    const r = await mergeBatch(db, mech, tablet.batch([fit, withdraw(tablet, fit.id, "Typed four, fitted none yet")]));
    expect(r.accepted).toHaveLength(2);
    expect(await lot(body.lots![0])).toEqual({ on_hand: 4, reserved: 0 });
    const moves = await db.selectFrom("stock_movements").select("kind").where("lot_id", "=", body.lots![0]).execute();
    expect(moves.map((m) => m.kind)).toEqual(["received"]);
  });
});

describe("the batch search", () => {
  it("finds the batch received, put aside and fitted, with the job and the bike", async () => {
    const { fx, office, stepId } = await setup();
    const { body } = await receive(office, { supplier: "Harbour Pistons", lines: [rodBolts()] });
    await reservationsRoute.handle(post("/api/office/stock/reservations", { lotId: body.lots![0], workOrderNumber: 1, quantity: 2 }), {
      user: office,
      db,
    });
    const mech = asUser(fx.users.mechanic);
    const tablet = new Tablet(`tab-${randomUUID().slice(0, 6)}`, mech.id, fx.workOrderId);
    await mergeBatch(db, mech, tablet.batch([tablet.make("part.fitted", fitBolts(stepId, { quantity: 2 }))]));
    const res = await searchRoute.handle(appRequest("/api/office/stock/search?code=l24-118"), { user: office, db });
    const { events } = (await res.json()) as {
      events: Array<{ event: string; quantity: number; workOrderNumber: number | null; tagCode: string | null; supplier: string | null }>;
    };
    expect(events.map((e) => [e.event, e.quantity, e.workOrderNumber, e.tagCode])).toEqual([
      ["received", 8, null, null],
      ["reserved", 2, 1, fx.bike.tag_code],
      ["fitted", 2, 1, fx.bike.tag_code],
    ]);
    expect(events[0].supplier).toBe("Harbour Pistons");
    const other = createShopFixture(db);
    const outsider = asUser((await other).users.office);
    const none = await searchRoute.handle(appRequest("/api/office/stock/search?code=L24-118"), { user: outsider, db });
    expect(((await none.json()) as { events: unknown[] }).events).toEqual([]);
  });
});

describe("hostile input to the stock routes", () => {
  it("answers in workshop words: a NUL in the search, a job that does not exist, stock of another shop", async () => {
    const { fx, office } = await setup();
    const nul = await searchRoute.handle(appRequest(`/api/office/stock/search?code=${encodeURIComponent("L24\u0000")}`), {
      user: office,
      db,
    });
    expect(nul.status).toBe(400);
    expect(((await nul.json()) as { issues: Array<{ message: string }> }).issues[0].message).toMatch(
      /^Batch or serial number holds a NUL character/,
    );
    const { body } = await receive(office, { supplier: "Harbour Pistons", lines: [rodBolts()] });
    const noJob = await reservationsRoute.handle(
      post("/api/office/stock/reservations", { lotId: body.lots![0], workOrderNumber: 99999, quantity: 1 }),
      {
        user: office,
        db,
      },
    );
    expect(noJob.status).toBe(422);
    expect(((await noJob.json()) as { error: string }).error).toBe("There is no job #99999 in this shop.");
    const outsider = asUser((await createShopFixture(db)).users.office);
    const theirs = await reservationsRoute.handle(
      post("/api/office/stock/reservations", { lotId: body.lots![0], workOrderNumber: 1, quantity: 1 }),
      {
        user: outsider,
        db,
      },
    );
    expect(theirs.status).toBe(404);
    expect(await lot(body.lots![0])).toEqual({ on_hand: 8, reserved: 0 });
    expect(fx.shopId).not.toBe(outsider.shopId);
  });
});
