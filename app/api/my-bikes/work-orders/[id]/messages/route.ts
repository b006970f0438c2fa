import { mailCustomerMessage } from "@/app/_server/customer-contact-mail";
import { created, idParam, json, route } from "@/app/_server/route";
import { appendAudit } from "@/db/audit/append";
import { addMessage, customersWorkOrder, threadOf } from "@/db/customer-contact/messages";
import { messageSchema } from "@/lib/customer-contact/schemas";

// The message thread of one of the customer's own jobs. GET: every message, oldest first.
// POST: a question or a reply from the customer; the shop's office sign-ins get it by e-mail.
// Another customer's job is "not found", for reading and writing alike.

export const GET = route({ access: { area: "my-bikes" }, params: ["id"] }, async ({ user, params, db }) => {
  const w = await customersWorkOrder(db, user.shopId, user.customerId, idParam(params.id, "No such job among your bikes."));
  return { messages: await threadOf(db, user.shopId, w.id) };
});

export const POST = route(
  { access: { area: "my-bikes" }, params: ["id"], body: json(messageSchema, { maxBytes: 64 * 1024, labels: { body: "Message" } }) },
  async ({ user, params, body, db }) => {
    const w = await customersWorkOrder(db, user.shopId, user.customerId, idParam(params.id, "No such job among your bikes."));
    const m = await addMessage(db, { shopId: user.shopId, workOrderId: w.id, authorId: user.id, fromCustomer: true, body: body.body });
    await mailCustomerMessage(db, user.shopId, w.id, m.id, body.body);
    await appendAudit(db, [
      {
        shopId: user.shopId,
        actorId: user.id,
        workOrderId: w.id,
        action: "message.from-customer",
        entity: "work_order_message",
        entityId: m.id,
        outcome: "accepted",
      },
    ]);
    return created({ id: m.id, writtenAt: m.writtenAt });
  },
);
