import { mailBikeReady } from "@/app/_server/customer-mail";
import { idParam, json, route } from "@/app/_server/route";
import { handOver } from "@/db/office/invoices";
import { moveWorkOrder } from "@/db/shop/work-orders";
import { transitionSchema } from "@/lib/office/schemas";

// Moves the work order on. Handover writes the final invoice in the same transaction; "ready"
// e-mails the customer with the handover build report attached.
export const POST = route(
  { access: { area: "office" }, params: ["id"], body: json(transitionSchema) },
  async ({ user, params, body, db }) => {
    const id = idParam(params.id);
    const opts = { note: body.note, templateVersionIds: body.to === "in_build" ? body.templateVersionIds : [] };
    if (body.to === "handed_over") {
      await handOver(db, user.shopId, user.id, id, opts.note);
    } else {
      await moveWorkOrder(db, user.shopId, user.id, id, body.to, opts);
    }
    const mail = body.to === "ready" ? await mailBikeReady(db, user.shopId, id) : undefined;
    return { status: body.to, mail };
  },
);
