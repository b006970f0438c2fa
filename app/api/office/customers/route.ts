import { NextResponse } from "next/server";
import { guarded, readJson } from "@/app/_server/route-helpers";
import { db } from "@/db/setup/client";
import { createCustomer, pageCustomers } from "@/db/shop/customers";
import { customerSchema, pageQuerySchema } from "@/lib/office/schemas";

export const GET = guarded("office", async ({ req, user }) => {
  const q = pageQuerySchema.parse(Object.fromEntries(new URL(req.url).searchParams));
  const { rows, total } = await pageCustomers(db(), user.shopId, { ...q, dir: new URL(req.url).searchParams.get("dir") ? q.dir : "asc" });
  return NextResponse.json({ customers: rows, total, page: q.page, size: q.size });
});

export const POST = guarded("office", async ({ req, user }) => {
  const body = await readJson(req, customerSchema);
  return NextResponse.json(await createCustomer(db(), user.shopId, body), { status: 201 });
});
