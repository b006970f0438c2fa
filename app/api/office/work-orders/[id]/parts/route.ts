import { created, idParam, json, route } from "@/app/_server/route";
import { addPartFitted } from "@/db/office/parts";
import { partFittedSchema } from "@/lib/office/schemas";

export const POST = route(
  { access: { area: "office" }, params: ["id"], body: json(partFittedSchema) },
  async ({ user, params, body, db }) => created(await addPartFitted(db, user.shopId, user.id, idParam(params.id), body)),
);
