import "server-only";
import { sql, type Kysely } from "kysely";
import type { CustomerInput } from "@/lib/office/schemas";
import { customerSchema } from "@/lib/office/schemas";
import { Refusal } from "@/lib/errors";
import type { Database } from "../schema";
import { containsPattern } from "./search";

export interface PageOpts {
  page: number;
  size: number;
  q: string;
  sort: string;
  dir: "asc" | "desc";
}

const CUSTOMER_SORTS = { name: "c.name", created: "c.created_at", bikes: "bikeCount" } as const;

// One page of a shop's customers, searched by name, e-mail, phone or a bike's tag.
export async function pageCustomers(db: Kysely<Database>, shopId: string, o: PageOpts) {
  let base = db.selectFrom("customers as c").where("c.shop_id", "=", shopId);
  if (o.q) {
    const like = containsPattern(o.q);
    base = base.where((eb) =>
      eb.or([
        eb("c.name", "ilike", like),
        eb("c.email", "ilike", like),
        eb("c.phone", "ilike", like),
        eb.exists(eb.selectFrom("bikes as b").select("b.id").whereRef("b.customer_id", "=", "c.id").where("b.tag_code", "ilike", like)),
      ]),
    );
  }
  const { n } = await base.select((eb) => eb.fn.countAll<number>().as("n")).executeTakeFirstOrThrow();
  const sortCol = Object.hasOwn(CUSTOMER_SORTS, o.sort) ? CUSTOMER_SORTS[o.sort as keyof typeof CUSTOMER_SORTS] : "c.name";
  const rows = await base
    .select([
      "c.id",
      "c.name",
      "c.email",
      "c.phone",
      "c.created_at as createdAt",
      (eb) =>
        eb
          .selectFrom("bikes as b")
          .select((e) => e.fn.countAll<number>().as("n"))
          .whereRef("b.customer_id", "=", "c.id")
          .as("bikeCount"),
    ])
    .orderBy(sql.ref(sortCol), o.dir)
    .orderBy("c.id")
    .limit(o.size)
    .offset(o.page * o.size)
    .execute();
  return { total: Number(n), rows: rows.map((r) => ({ ...r, bikeCount: Number(r.bikeCount) })) };
}

export async function createCustomer(db: Kysely<Database>, shopId: string, input: CustomerInput) {
  const c = customerSchema.parse(input);
  return db
    .insertInto("customers")
    .values({ shop_id: shopId, name: c.name, email: c.email, phone: c.phone, notes: c.notes })
    .returning("id")
    .executeTakeFirstOrThrow();
}

export async function updateCustomer(db: Kysely<Database>, shopId: string, id: string, input: CustomerInput) {
  const c = customerSchema.parse(input);
  const r = await db
    .updateTable("customers")
    .set({ name: c.name, email: c.email, phone: c.phone, notes: c.notes, updated_at: sql`now()` })
    .where("id", "=", id)
    .where("shop_id", "=", shopId)
    .executeTakeFirst();
  if (!r.numUpdatedRows) throw new Refusal("No such customer in this shop.", 404);
}

export async function getCustomer(db: Kysely<Database>, shopId: string, id: string) {
  const customer = await db
    .selectFrom("customers")
    .select(["id", "name", "email", "phone", "notes"])
    .where("id", "=", id)
    .where("shop_id", "=", shopId)
    .executeTakeFirst();
  if (!customer) return null;
  const bikes = await db
    .selectFrom("bikes")
    .select(["id", "make", "model", "year", "tag_code as tagCode", "colour"])
    .where("customer_id", "=", id)
    .where("shop_id", "=", shopId)
    .orderBy("tag_code")
    .execute();
  return { ...customer, bikes };
}

export async function listCustomers(db: Kysely<Database>, shopId: string) {
  return db.selectFrom("customers").select(["id", "name", "email", "phone"]).where("shop_id", "=", shopId).orderBy("name").execute();
}
