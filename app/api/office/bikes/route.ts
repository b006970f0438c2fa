import { z } from "zod";
import { created, json, route } from "@/app/_server/route";
import { createBike, searchBikes } from "@/db/shop/bikes";
import { bikeSchema } from "@/lib/office/schemas";

const search = z.object({ q: z.string().max(200).default("") });

// GET: bikes to choose from (search by tag, make, model or owner). POST: add a bike.
export const GET = route({ access: { area: "office" }, query: search }, async ({ user, query, db }) => ({
  bikes: await searchBikes(db, user.shopId, query.q),
}));

export const POST = route({ access: { area: "office" }, body: json(bikeSchema) }, async ({ user, body, db }) =>
  created(await createBike(db, user.shopId, body)),
);
