import { mailQuoteReady } from "@/app/_server/customer-mail";
import { idParam, route } from "@/app/_server/route";
import { quoteWithLines, sendQuote } from "@/db/office/quotes";

export const POST = route({ access: { area: "office" }, params: ["id"] }, async ({ user, params, db }) => {
  const id = idParam(params.id);
  const { quoteId } = await sendQuote(db, user.shopId, user.id, id);
  const q = (await quoteWithLines(db, user.shopId, quoteId))!;
  const mail = await mailQuoteReady(db, user.shopId, id, quoteId, q.totalMinor, q.depositMinor);
  return { quoteId, mail };
});
