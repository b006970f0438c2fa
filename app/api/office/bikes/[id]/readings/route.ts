import { idParam, route } from "@/app/_server/route";
import { bikeReadings } from "@/db/records/bike-record";
import { Refusal } from "@/lib/errors";
import { readingsCsv } from "@/lib/records/readings-csv";

// GET: every reading taken on the bike, as CSV (README "Readings CSV"), values exactly as typed.
export const GET = route({ access: { area: "bike-records" }, params: ["id"] }, async ({ user, params, db }) => {
  const found = await bikeReadings(db, user.shopId, idParam(params.id, "No such bike in this shop."));
  if (!found) throw new Refusal("No such bike in this shop.", 404);
  return new Response(readingsCsv(found.rows), {
    headers: {
      "content-type": "text/csv; charset=utf-8",
      "content-disposition": `attachment; filename="readings-${found.tagCode.replace(/[^A-Za-z0-9-]/g, "_")}.csv"`,
      "cache-control": "no-store",
    },
  });
});
