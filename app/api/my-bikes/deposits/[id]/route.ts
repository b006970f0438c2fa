import { NextResponse } from "next/server";
import { guarded, idFrom } from "@/app/_server/route-helpers";
import { db } from "@/db/setup/client";
import { depositForCustomer } from "@/db/office/deposits";
import { Refusal } from "@/lib/office/refusal";

export const GET = guarded<{ id: string }>("my-bikes", async ({ user, params }) => {
  const d = await depositForCustomer(db(), user, idFrom(params.id));
  if (!d) throw new Refusal("No such deposit.", 404);
  return NextResponse.json({ deposit: d });
});
