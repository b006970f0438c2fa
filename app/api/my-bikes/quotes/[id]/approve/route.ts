import { NextResponse } from "next/server";
import { guarded, idFrom } from "@/app/_server/route-helpers";
import { db } from "@/db/setup/client";
import { approveQuoteAsCustomer } from "@/db/office/quotes";

// The customer approves their own quote (anyone else's: 403).
export const POST = guarded<{ id: string }>("my-bikes", async ({ user, params }) => {
  return NextResponse.json(await approveQuoteAsCustomer(db(), user, idFrom(params.id)));
});
