import { sendInvitation } from "@/app/_server/send-invitation";
import { created, idParam, route } from "@/app/_server/route";

// POST: e-mail a customer's sign-in a new invitation link to set their password. Every earlier
// link of that sign-in stops working once this one is sent.
export const POST = route({ access: { area: "users" }, params: ["id"] }, async ({ user, params, db }) =>
  created(await sendInvitation(db, user, idParam(params.id))),
);
