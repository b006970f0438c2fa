import { route } from "@/app/_server/route";
import { searchStockByCode } from "@/db/stock/search";
import { stockSearchSchema } from "@/lib/stock/input";

// GET /api/office/stock/search?code=: every event of a batch or serial number — received, put aside, let go, fitted.
export const GET = route({ access: { area: "office" }, query: stockSearchSchema }, async ({ user, query, db }) => ({
  events: await searchStockByCode(db, user.shopId, query.code),
}));
