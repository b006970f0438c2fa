import { NextResponse } from "next/server";
import { guarded, idFrom, readJson } from "@/app/_server/route-helpers";
import { appendAudit } from "@/db/audit/append";
import { db } from "@/db/setup/client";
import { setUserActive } from "@/db/shop/users";
import { userActiveSchema } from "@/lib/office/user-schema";

export const PUT = guarded<{ id: string }>("users", async ({ req, user, params }) => {
  const id = idFrom(params.id);
  const { active } = await readJson(req, userActiveSchema);
  await setUserActive(db(), user.shopId, user.id, id, active);
  await appendAudit(db(), [{ shopId: user.shopId, actorId: user.id, action: active ? "user.activated" : "user.deactivated", entity: "user", entityId: id, outcome: "accepted" }]);
  return NextResponse.json({ id, active });
});
