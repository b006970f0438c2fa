import { route } from "@/app/_server/route";
import { lotsOnHand, lowStock, openReservations, stockShortfalls } from "@/db/stock/on-hand";

// GET /api/office/stock: lots on the shelf, what is put aside for which job, the low-stock list and
// fits the shelf could not cover.
export const GET = route({ access: { area: "office" } }, async ({ user, db }) => {
  const [lots, reservations, low, shortfalls] = await Promise.all([
    lotsOnHand(db, user.shopId),
    openReservations(db, user.shopId),
    lowStock(db, user.shopId),
    stockShortfalls(db, user.shopId),
  ]);
  return { lots, reservations, low, shortfalls };
});
