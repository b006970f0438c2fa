import { z } from "zod";
import { handToQueue } from "@/app/_server/mail";
import { json, route } from "@/app/_server/route";
import { appendAudit } from "@/db/audit/append";
import { outboxForOffice, requeueFailedMail } from "@/db/mail/outbox";
import { Refusal } from "@/lib/errors";

// GET: the shop's e-mails not yet sent (waiting for a try, being sent, failed for good) and the
// last ones sent. POST { id }: try a failed e-mail again (queued once more; recorded in the audit log).
export const GET = route({ access: { area: "office" } }, async ({ user, db }) => outboxForOffice(db, user.shopId));

const tryAgain = z.object({ id: z.uuid({ error: "E-mail: not one of this shop's" }) });

export const POST = route({ access: { area: "office" }, body: json(tryAgain) }, async ({ user, body, db }) => {
  if (!(await requeueFailedMail(db, user.shopId, body.id)))
    throw new Refusal("E-mail: only a failed e-mail of this shop can be tried again.", 409);
  await handToQueue([body.id], undefined, true).catch((e) =>
    console.error("[mail] queue not reached; the sweep will hand the e-mail on", e),
  );
  await appendAudit(db, [
    { shopId: user.shopId, actorId: user.id, action: "mail.try-again", entity: "mail", entityId: body.id, outcome: "accepted" },
  ]);
  return { queued: body.id };
});
