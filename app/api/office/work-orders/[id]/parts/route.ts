import { NextResponse } from "next/server";
import { guarded, idFrom, readJson } from "@/app/_server/route-helpers";
import { db } from "@/db/setup/client";
import { addPartFitted } from "@/db/office/parts";
import { partFittedSchema } from "@/lib/office/schemas";

export const POST = guarded<{ id: string }>("office", async ({ req, user, params }) => {
  const body = await readJson(req, partFittedSchema);
  return NextResponse.json(await addPartFitted(db(), user.shopId, user.id, idFrom(params.id), body), { status: 201 });
});
