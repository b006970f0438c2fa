import { NextResponse } from "next/server";
import { mailQuoteReady } from "@/app/_server/customer-mail";
import { guarded, idFrom } from "@/app/_server/route-helpers";
import { db } from "@/db/setup/client";
import { quoteWithLines, sendQuote } from "@/db/office/quotes";

export const POST = guarded<{ id: string }>("office", async ({ user, params }) => {
  const id = idFrom(params.id);
  const { quoteId } = await sendQuote(db(), user.shopId, user.id, id);
  const q = (await quoteWithLines(db(), user.shopId, quoteId))!;
  const mail = await mailQuoteReady(db(), user.shopId, id, q.total_minor, q.deposit_minor);
  return NextResponse.json({ quoteId, mail });
});
