import { NextResponse } from "next/server";
import { guarded, readJson } from "@/app/_server/route-helpers";
import { appendAudit } from "@/db/audit/append";
import { db } from "@/db/setup/client";
import { createShopUser, listShopUsers } from "@/db/shop/users";
import { newUserSchema } from "@/lib/office/user-schema";

export const GET = guarded("users", async ({ user }) => NextResponse.json({ users: await listShopUsers(db(), user.shopId) }));

export const POST = guarded("users", async ({ req, user }) => {
  const body = await readJson(req, newUserSchema);
  const created = await createShopUser(db(), user.shopId, body);
  await appendAudit(db(), [{ shopId: user.shopId, actorId: user.id, action: "user.created", entity: "user", entityId: created.id, outcome: "accepted", detail: { role: body.role } }]);
  return NextResponse.json(created, { status: 201 });
});
