import { idParam, route } from "@/app/_server/route";
import { invoiceOf } from "@/db/office/invoices";
import { stepsOfWorkOrder } from "@/db/office/parts";
import { quotesOfWorkOrder } from "@/db/office/quotes";
import { mechanicsOf, workOrderDetail } from "@/db/shop/work-orders";
import { latestTemplateVersions } from "@/db/templates/versions";
import { Refusal } from "@/lib/errors";
import { allowedNextStatuses } from "@/lib/work-orders/status";

// Everything the work-order page shows, in one answer.
export const GET = route({ access: { area: "office" }, params: ["id"] }, async ({ user, params, db }) => {
  const id = idParam(params.id);
  const detail = await workOrderDetail(db, user.shopId, id);
  if (!detail) throw new Refusal("No such work order in this shop.", 404);
  const [quotes, invoice, mechanics, templates, steps] = await Promise.all([
    quotesOfWorkOrder(db, user.shopId, id),
    invoiceOf(db, user.shopId, id),
    mechanicsOf(db, user.shopId),
    latestTemplateVersions(db, user.shopId),
    stepsOfWorkOrder(db, id),
  ]);
  return { workOrder: detail, next: allowedNextStatuses(detail.status), quotes, invoice, mechanics, templates, steps };
});
