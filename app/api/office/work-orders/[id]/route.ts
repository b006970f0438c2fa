import { reviseAfterAcceptedChange } from "@/app/_server/frozen-report";
import { idParam, route } from "@/app/_server/route";
import { comeBackLinksOf } from "@/db/aftercare/come-backs";
import { listReminders } from "@/db/aftercare/reminders";
import { invoiceOf } from "@/db/office/invoices";
import { stepsOfWorkOrder } from "@/db/office/parts";
import { quotesOfWorkOrder } from "@/db/office/quotes";
import { loadOpenItems } from "@/db/records/open-items";
import { reportRevisionsOf } from "@/db/records/report-revisions";
import { overridesOf } from "@/db/records/status-overrides";
import { mechanicsOf, workOrderDetail } from "@/db/shop/work-orders";
import { latestTemplateVersions } from "@/db/templates/versions";
import { Refusal } from "@/lib/errors";
import { allowedNextStatuses } from "@/lib/work-orders/status";

// Everything the work-order page shows, in one answer: the job, its quotes and invoice, what is
// still open on its record (the checklist the gates on "ready" and "handed over" read), the
// office's overrides, the stored copies of the build report (brought up to date first), its
// come-backs (or the job it is a come-back of) and its reminders.
export const GET = route({ access: { area: "office" }, params: ["id"] }, async ({ user, params, db }) => {
  const id = idParam(params.id);
  const detail = await workOrderDetail(db, user.shopId, id);
  if (!detail) throw new Refusal("No such work order in this shop.", 404);
  if (detail.status === "handed_over") await reviseAfterAcceptedChange(db, user.shopId, id, null);
  const [quotes, invoice, mechanics, templates, steps, openItems, overrides, reports, comeBacks, reminders] = await Promise.all([
    quotesOfWorkOrder(db, user.shopId, id),
    invoiceOf(db, user.shopId, id),
    mechanicsOf(db, user.shopId),
    latestTemplateVersions(db, user.shopId),
    stepsOfWorkOrder(db, id),
    loadOpenItems(db, user.shopId, id),
    overridesOf(db, user.shopId, id),
    reportRevisionsOf(db, user.shopId, id),
    comeBackLinksOf(db, user.shopId, id),
    listReminders(db, user.shopId, { workOrderId: id }),
  ]);
  return {
    workOrder: detail,
    next: allowedNextStatuses(detail.status),
    quotes,
    invoice,
    mechanics,
    templates,
    steps,
    openItems: openItems ?? [],
    overrides,
    reports,
    comeBacks,
    reminders: reminders.rows,
  };
});
