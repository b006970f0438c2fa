import { idParam, json, route } from "@/app/_server/route";
import { answerAsCustomer } from "@/db/office/supplements";
import { decisionsSchema } from "@/lib/office/extra-work-schemas";

// The signed-in customer approves or declines each line of extra work on their own bike (once; anyone else's: 403).
export const POST = route(
  { access: { area: "my-bikes" }, params: ["id"], body: json(decisionsSchema) },
  async ({ user, params, body, db }) => answerAsCustomer(db, user, idParam(params.id), body),
);
