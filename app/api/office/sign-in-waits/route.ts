import { json, route } from "@/app/_server/route";
import { appendAudit } from "@/db/audit/append";
import { signInWaitRows } from "@/app/_server/sign-in-waits";
import { clearSignInBucket } from "@/db/auth/sign-in-waits";
import { parseBucketKey } from "@/lib/auth/sign-in-throttle";
import { Refusal } from "@/lib/errors";
import { clearWaitSchema } from "@/lib/auth/session-schemas";

// GET: failed sign-ins of the last hour that touched the shop's accounts, by bucket (one account
// from one address, one address, one account), with the wait each now asks for.
// POST { key }: clear a bucket — its count starts again (recorded, and in the audit log).
export const GET = route({ access: { area: "users" } }, async ({ user, db }) => ({ waits: await signInWaitRows(db, user.shopId) }));

export const POST = route({ access: { area: "users" }, body: json(clearWaitSchema) }, async ({ user, body, db }) => {
  const outcome = parseBucketKey(body.key) ? await clearSignInBucket(db, user.shopId, body.key, user.id) : "not-ours";
  if (outcome === "not-ours") throw new Refusal("No sign-in wait of this shop by that name.", 404);
  if (outcome === "others-too")
    throw new Refusal(
      "This wait also counts wrong passwords for sign-ins that are not your shop's (or for addresses nobody has), so it is not yours to clear: it ends on its own.",
      409,
    );
  await appendAudit(db, [
    {
      shopId: user.shopId,
      actorId: user.id,
      action: "sign-in.wait-cleared",
      entity: "sign-in-wait",
      entityId: body.key,
      outcome: "accepted",
    },
  ]);
  return { cleared: body.key };
});
