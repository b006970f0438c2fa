import { askRefund } from "@/app/_server/payments";
import { idParam, reply, route } from "@/app/_server/route";
import { auditRefundAsked, giveBackInShop } from "@/db/office/give-backs";
import { Refusal } from "@/lib/errors";
import { formatMinor } from "@/lib/money/quote-totals";

// POST: ask the payment provider to give back what is left of one line of money to give back.
// 202: asked; the line goes when the provider reports the refund in full (charge.refunded).
// Pressing again before that asks nothing twice (the same idempotency key). 404 not in this shop
// · 409 given back already, or the provider refused (its words). Audited, refusals too.
export const POST = route({ access: { area: "office" }, params: ["id"] }, async ({ user, params, db }) => {
  const g = await giveBackInShop(db, user.shopId, idParam(params.id));
  if (!g) throw new Refusal("There is no such money to give back in this shop.", 404);
  if (g.givenBackAt) throw new Refusal("This money is given back already: the payment provider reported the refund in full.", 409);
  const left = g.amountMinor - g.givenBackMinor;
  const facts = {
    shopId: user.shopId,
    actorId: user.id,
    giveBackId: g.id,
    workOrderId: g.workOrderId,
    paymentIntentId: g.paymentIntentId,
    amountMinor: left,
    currency: g.currency,
  };
  try {
    const refund = await askRefund(g.paymentIntentId, left, `give-back-${g.id}-${g.givenBackMinor}`);
    await auditRefundAsked(db, facts, { refundId: refund.id });
    return reply(
      {
        askedMinor: left,
        currency: g.currency,
        refundId: refund.id,
        message: `Asked the payment provider to give back ${formatMinor(left, g.currency)}. The line goes when it reports the refund.`,
      },
      { status: 202 },
    );
  } catch (e) {
    if (e instanceof Refusal) await auditRefundAsked(db, facts, { refused: e.message });
    throw e;
  }
});
