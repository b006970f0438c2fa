import { idParam, json, route } from "@/app/_server/route";
import { issueBill } from "@/db/office/final-bill";
import { billChoicesSchema } from "@/lib/office/extra-work-schemas";

// The office issues the job's bill once, choosing per labour line "as quoted" or "as clocked" and adding fitted parts no line named.
export const POST = route(
  { access: { area: "office" }, params: ["id"], body: json(billChoicesSchema) },
  async ({ user, params, body, db }) => {
    const invoice = await issueBill(db, user.shopId, user.id, idParam(params.id), body);
    return {
      invoiceId: invoice.id,
      number: invoice.number,
      totalMinor: Number(invoice.total_minor),
      balanceDueMinor: Number(invoice.balance_due_minor),
    };
  },
);
