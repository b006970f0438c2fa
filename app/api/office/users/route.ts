import { created, json, route } from "@/app/_server/route";
import { sendInvitation } from "@/app/_server/send-invitation";
import { appendAudit } from "@/db/audit/append";
import { createShopUser, listShopUsers } from "@/db/shop/users";
import { newUserSchema } from "@/lib/office/user-schema";

export const GET = route({ access: { area: "users" } }, async ({ user, db }) => ({ users: await listShopUsers(db, user.shopId) }));

export const POST = route({ access: { area: "users" }, body: json(newUserSchema) }, async ({ user, body, db }) => {
  const made = await createShopUser(db, user.shopId, body);
  await appendAudit(db, [
    {
      shopId: user.shopId,
      actorId: user.id,
      action: "user.created",
      entity: "user",
      entityId: made.id,
      outcome: "accepted",
      detail: { role: body.role },
    },
  ]);
  // a customer's sign-in made without a password: they choose their own from an invitation e-mail
  const invitation = body.role === "customer" && !body.password ? await sendInvitation(db, user, made.id) : null;
  return created({ ...made, invitation });
});
