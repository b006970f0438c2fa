import "server-only";
import { notWithdrawn } from "../records/withdrawn";
import type { Kysely } from "kysely";
import { partFittedSchema } from "@/lib/office/schemas";
import { Refusal } from "@/lib/errors";
import type { z } from "zod";
import { partColumns } from "../records/parts-fitted";
import { planStockDraws, writeStockDraws } from "../stock/draw";
import { withOpenRecord } from "../shop/open-record";
import type { Database } from "../schema";

export async function addPartFitted(
  db: Kysely<Database>,
  shopId: string,
  userId: string,
  workOrderId: string,
  input: z.input<typeof partFittedSchema>,
) {
  const p = partFittedSchema.parse(input);
  return withOpenRecord(db, { shopId, userId }, workOrderId, "part", async (trx) => {
    if (p.stepId) {
      const step = await trx
        .selectFrom("template_steps as s")
        .innerJoin("job_procedures as j", "j.template_version_id", "s.template_version_id")
        .select("s.id")
        .where("s.id", "=", p.stepId)
        .where("j.work_order_id", "=", workOrderId)
        .executeTakeFirst();
      if (!step)
        throw new Refusal("That step is not part of this job's procedures.", 422, [{ path: "stepId", message: "not a step of this job" }]);
    }
    const row = await trx
      .insertInto("parts_fitted")
      .values({
        shop_id: shopId,
        work_order_id: workOrderId,
        step_id: p.stepId,
        part_number: p.partNumber,
        description: p.description,
        supplier: p.supplier,
        serial: p.serial,
        batch: p.batch,
        quantity: p.quantity,
        fitted_by: userId,
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    // A part the shop keeps in stock is drawn from the shelf as a bench fit is (db/stock/draw.ts),
    // under the lots' row locks: never refused for stock, and what the shelf could not cover is said.
    const fit = {
      id: row.id,
      workOrderId,
      authorId: userId,
      payload: {
        partFittedId: row.id,
        partNumber: p.partNumber,
        quantity: p.quantity,
        serial: p.serial ?? undefined,
        batch: p.batch ?? undefined,
      },
    };
    const draw = (await planStockDraws(trx, shopId, [fit])).get(row.id);
    if (draw) await writeStockDraws(trx, shopId, [draw]);
    return { id: row.id, stockNote: draw?.reason ?? null };
  });
}

// "Which bikes got batch X?" — one query: every fitting of a part whose batch or serial matches
// exactly (case-insensitive), with the bike, its owner and the work order.
export async function bikesWithPart(
  db: Kysely<Database>,
  shopId: string,
  code: string,
  field: "batch" | "serial" | "part_number" = "batch",
) {
  return (
    db
      .selectFrom("parts_fitted as p")
      .innerJoin("work_orders as w", "w.id", "p.work_order_id")
      .innerJoin("bikes as b", "b.id", "w.bike_id")
      .innerJoin("customers as c", "c.id", "b.customer_id")
      .select([
        ...partColumns,
        "w.id as workOrderId",
        "w.number as workOrderNumber",
        "b.id as bikeId",
        "b.tag_code as tagCode",
        "b.make",
        "b.model",
        "c.name as customerName",
      ])
      .where("p.shop_id", "=", shopId)
      .where((eb) => eb(eb.fn("lower", [`p.${field}`]), "=", code.trim().toLowerCase()))
      // a fit withdrawn at the bench was recorded by mistake: the bike did not get the part
      .where(notWithdrawn("p.operation_id"))
      .orderBy("b.tag_code")
      .orderBy("p.fitted_at")
      .execute()
  );
}

// Steps of the job's pinned procedures, for "which step fitted this part".
export async function stepsOfWorkOrder(db: Kysely<Database>, workOrderId: string) {
  return db
    .selectFrom("template_steps as s")
    .innerJoin("job_procedures as j", "j.template_version_id", "s.template_version_id")
    .select(["s.id", "s.title", "s.stage_title as stageTitle", "j.position"])
    .where("j.work_order_id", "=", workOrderId)
    .orderBy("j.position")
    .orderBy("s.stage_position")
    .orderBy("s.position")
    .execute();
}
