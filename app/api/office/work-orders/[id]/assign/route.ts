import { NextResponse } from "next/server";
import { guarded, idFrom, readJson } from "@/app/_server/route-helpers";
import { db } from "@/db/setup/client";
import { assignMechanic } from "@/db/shop/work-orders";
import { assignSchema } from "@/lib/office/schemas";

export const POST = guarded<{ id: string }>("office", async ({ req, user, params }) => {
  const body = await readJson(req, assignSchema);
  await assignMechanic(db(), user.shopId, user.id, idFrom(params.id), body.mechanicId);
  return NextResponse.json({ ok: true });
});
