import { z } from "zod";
import { created, json, route } from "@/app/_server/route";
import { createCustomer, pageCustomers } from "@/db/shop/customers";
import { customerSchema, pageQuerySchema } from "@/lib/office/schemas";

// Customers sort by name, A to Z, unless the list asks otherwise.
const customerPageSchema = pageQuerySchema.extend({ dir: z.enum(["asc", "desc"]).default("asc") });

export const GET = route({ access: { area: "office" }, query: customerPageSchema }, async ({ user, query, db }) => {
  const { rows, total } = await pageCustomers(db, user.shopId, query);
  return { customers: rows, total, page: query.page, size: query.size };
});

export const POST = route({ access: { area: "office" }, body: json(customerSchema) }, async ({ user, body, db }) =>
  created(await createCustomer(db, user.shopId, body)),
);
