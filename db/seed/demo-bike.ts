import type { Kysely } from "kysely";
import type { Database } from "../schema";

/** An invented demo bike. */
export interface DemoBike {
  make: string;
  model: string;
  year: number;
  cc: number;
  colour: string;
  tag: string;
}

/** Writes one demo bike for its owner; returns its id. */
export async function insertDemoBike(db: Kysely<Database>, shopId: string, customerId: string, b: DemoBike): Promise<string> {
  const { id } = await db
    .insertInto("bikes")
    .values({
      shop_id: shopId,
      customer_id: customerId,
      make: b.make,
      model: b.model,
      year: b.year,
      displacement_cc: b.cc,
      colour: b.colour,
      tag_code: b.tag,
      vin: null,
      engine_number: null,
    })
    .returning("id")
    .executeTakeFirstOrThrow();
  return id;
}
