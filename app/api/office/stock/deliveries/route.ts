import { created, json, route } from "@/app/_server/route";
import { receiveDelivery } from "@/db/stock/receive";
import { deliverySchema } from "@/lib/stock/input";

// POST /api/office/stock/deliveries: receives a delivery (all lines or none; a bad line is refused with its reason).
export const POST = route({ access: { area: "office" }, body: json(deliverySchema) }, async ({ user, body, db }) =>
  created(await receiveDelivery(db, user, body)),
);
