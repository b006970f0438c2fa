import { idParam, route } from "@/app/_server/route";
import { approveQuoteAsCustomer } from "@/db/office/quotes";

// The customer approves their own quote (anyone else's: 403).
export const POST = route({ access: { area: "my-bikes" }, params: ["id"] }, async ({ user, params, db }) =>
  approveQuoteAsCustomer(db, user, idParam(params.id)),
);
