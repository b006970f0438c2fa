import { route } from "@/app/_server/route";
import { bikesOfCustomer } from "@/db/shop/bikes";

// GET: the signed-in customer's own bikes with their work orders.
export const GET = route({ access: { area: "my-bikes" } }, async ({ user, db }) => ({
  bikes: user.customerId ? await bikesOfCustomer(db, user.shopId, user.customerId) : [],
}));
