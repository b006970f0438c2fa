import { NextResponse } from "next/server";
import { mailBikeReady } from "@/app/_server/customer-mail";
import { guarded, idFrom, readJson } from "@/app/_server/route-helpers";
import { db } from "@/db/setup/client";
import { handOver } from "@/db/office/invoices";
import { moveWorkOrder } from "@/db/shop/work-orders";
import { transitionSchema } from "@/lib/office/schemas";

// Moves the work order on. Handover writes the final invoice in the same transaction; "ready"
// e-mails the customer with the handover build report attached.
export const POST = guarded<{ id: string }>("office", async ({ req, user, params }) => {
  const id = idFrom(params.id);
  const body = await readJson(req, transitionSchema);
  const opts = { note: body.note, templateVersionIds: body.to === "in_build" ? body.templateVersionIds : [] };
  if (body.to === "handed_over") {
    await handOver(db(), user.shopId, user.id, id, opts.note);
  } else {
    await moveWorkOrder(db(), user.shopId, user.id, id, body.to, opts);
  }
  const mail = body.to === "ready" ? await mailBikeReady(db(), user.shopId, id) : undefined;
  return NextResponse.json({ status: body.to, mail });
});
