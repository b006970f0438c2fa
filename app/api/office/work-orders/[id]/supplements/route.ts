import { mailExtraWork } from "@/app/_server/customer-mail";
import { idParam, json, route } from "@/app/_server/route";
import { writeSupplement } from "@/db/office/supplements";
import { supplementSchema } from "@/lib/office/extra-work-schemas";
import { amountFor } from "@/lib/money/final-bill";

// The office writes extra work found while in build; the customer is e-mailed a one-time link to answer each line.
export const POST = route(
  { access: { area: "office" }, params: ["id"], body: json(supplementSchema) },
  async ({ user, params, body, db }) => {
    const id = idParam(params.id);
    const written = await writeSupplement(db, user.shopId, user.id, id, body);
    const total = body.lines.reduce((s, l) => s + amountFor(l.quantityHundredths, l.unitPriceMinor), 0);
    const mail = await mailExtraWork(db, user.shopId, id, written.supplementId, total);
    return { supplementId: written.supplementId, number: written.number, mail };
  },
);
