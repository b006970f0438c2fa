import { idParam, json, route } from "@/app/_server/route";
import { appendAudit } from "@/db/audit/append";
import { setUserActive } from "@/db/shop/users";
import { userActiveSchema } from "@/lib/office/user-schema";

export const PUT = route(
  { access: { area: "users" }, params: ["id"], body: json(userActiveSchema) },
  async ({ user, params, body, db }) => {
    const id = idParam(params.id);
    await setUserActive(db, user.shopId, user.id, id, body.active);
    await appendAudit(db, [
      {
        shopId: user.shopId,
        actorId: user.id,
        action: body.active ? "user.activated" : "user.deactivated",
        entity: "user",
        entityId: id,
        outcome: "accepted",
      },
    ]);
    return { id, active: body.active };
  },
);
