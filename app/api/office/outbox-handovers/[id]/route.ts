import { idParam, route } from "@/app/_server/route";
import { outboxHandover } from "@/db/auth/outbox-handovers";
import { Refusal } from "@/lib/errors";

// GET: one tablet's handed-over outbox as a JSON file, for the office to read or keep.
export const GET = route({ access: { area: "users" }, params: ["id"] }, async ({ user, params, db }) => {
  const h = await outboxHandover(db, user.shopId, idParam(params.id));
  if (!h) throw new Refusal("Not found.", 404);
  return new Response(JSON.stringify(h, null, 2), {
    headers: {
      "content-type": "application/json; charset=utf-8",
      "content-disposition": `attachment; filename="handed-over-${h.deviceId.replace(/[^A-Za-z0-9._-]/g, "_")}.json"`,
      "cache-control": "no-store",
    },
  });
});
