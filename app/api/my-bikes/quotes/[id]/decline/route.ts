import { idParam, json, route } from "@/app/_server/route";
import { declineQuoteAsCustomer } from "@/db/office/quotes";
import { quoteDeclineSchema } from "@/lib/office/extra-work-schemas";

// The customer declines their quote, with an optional comment (anyone else's: 403).
export const POST = route(
  { access: { area: "my-bikes" }, params: ["id"], body: json(quoteDeclineSchema) },
  async ({ user, params, body, db }) => declineQuoteAsCustomer(db, user, idParam(params.id), body.comment),
);
