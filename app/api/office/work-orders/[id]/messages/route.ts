import { mailOfficeReply } from "@/app/_server/customer-contact-mail";
import { created, idParam, json, route } from "@/app/_server/route";
import { appendAudit } from "@/db/audit/append";
import { addMessage, officeWorkOrder, threadOf } from "@/db/customer-contact/messages";
import { messageSchema } from "@/lib/customer-contact/schemas";

// The customer's thread on a work order, from the office. GET: every message, oldest first.
// POST: the office's answer; the customer gets it by e-mail (when an address is on file).

export const GET = route({ access: { area: "office" }, params: ["id"] }, async ({ user, params, db }) => ({
  messages: await threadOf(db, user.shopId, await officeWorkOrder(db, user.shopId, idParam(params.id))),
}));

export const POST = route(
  { access: { area: "office" }, params: ["id"], body: json(messageSchema, { maxBytes: 64 * 1024, labels: { body: "Message" } }) },
  async ({ user, params, body, db }) => {
    const id = await officeWorkOrder(db, user.shopId, idParam(params.id));
    const m = await addMessage(db, { shopId: user.shopId, workOrderId: id, authorId: user.id, fromCustomer: false, body: body.body });
    const mail = await mailOfficeReply(db, user.shopId, id, m.id, body.body);
    await appendAudit(db, [
      {
        shopId: user.shopId,
        actorId: user.id,
        workOrderId: id,
        action: "message.from-office",
        entity: "work_order_message",
        entityId: m.id,
        outcome: "accepted",
      },
    ]);
    return created({ id: m.id, writtenAt: m.writtenAt, mailed: mail.queued, warning: mail.queued ? undefined : mail.reason });
  },
);
