import { mailBikeReady } from "@/app/_server/customer-mail";
import { storeHandoverCopy, storeReadyCopy } from "@/app/_server/frozen-report";
import { idParam, json, route } from "@/app/_server/route";
import { handOver } from "@/db/office/invoices";
import { moveAndMake, moveWorkOrder } from "@/db/shop/work-orders";
import { transitionSchema } from "@/lib/office/schemas";

// Moves the work order on. The moves to "ready" and "handed over" are gated on the record: with
// items still open they are refused (409, each open item listed) unless the body carries the
// office's override (a written reason and the open items it saw), which is recorded with the move.
// Handover writes the final invoice and stores the build report (revision 1) in the same
// transaction; "ready" stores the build report as the gate saw the record, in the move's own
// transaction, and e-mails the customer with that copy attached.
export const POST = route(
  { access: { area: "office" }, params: ["id"], body: json(transitionSchema) },
  async ({ user, params, body, db }) => {
    const id = idParam(params.id);
    const opts = { note: body.note, templateVersionIds: body.to === "in_build" ? body.templateVersionIds : [], override: body.override };
    let overrideId: string | null;
    let report: { revision: number; sha256: string } | undefined;
    let readyReport: string | undefined;
    if (body.to === "handed_over") {
      const done = await handOver(db, user.shopId, user.id, id, {
        ...opts,
        storeReport: (trx) => storeHandoverCopy(trx, user.shopId, id, user.id),
      });
      overrideId = done.overrideId;
      report = { revision: done.report.revision, sha256: done.report.sha256 };
    } else if (body.to === "ready") {
      const done = await moveAndMake(db, user.shopId, user.id, id, "ready", opts, (trx) => storeReadyCopy(trx, user.shopId, id));
      overrideId = done.overrideId;
      readyReport = done.made;
    } else {
      ({ overrideId } = await moveWorkOrder(db, user.shopId, user.id, id, body.to, opts));
    }
    const mail = readyReport ? await mailBikeReady(db, user.shopId, id, readyReport) : undefined;
    return { status: body.to, overrideId, report, mail };
  },
);
