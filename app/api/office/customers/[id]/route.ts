import { NextResponse } from "next/server";
import { guarded, idFrom, readJson } from "@/app/_server/route-helpers";
import { db } from "@/db/setup/client";
import { getCustomer, updateCustomer } from "@/db/shop/customers";
import { customerSchema } from "@/lib/office/schemas";
import { Refusal } from "@/lib/office/refusal";

export const GET = guarded<{ id: string }>("office", async ({ user, params }) => {
  const c = await getCustomer(db(), user.shopId, idFrom(params.id));
  if (!c) throw new Refusal("No such customer in this shop.", 404);
  return NextResponse.json({ customer: c });
});

export const PUT = guarded<{ id: string }>("office", async ({ req, user, params }) => {
  const body = await readJson(req, customerSchema);
  await updateCustomer(db(), user.shopId, idFrom(params.id), body);
  return NextResponse.json({ ok: true });
});
