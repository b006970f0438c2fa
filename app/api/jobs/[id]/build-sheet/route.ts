import { z } from "zod";
import { created, idParam, json, route } from "@/app/_server/route";
import { loadBuildNumbers, saveBuildSheet } from "@/db/records/build-sheets";
import { checkBuildSheet } from "@/lib/build-figures";
import { CHECK_THE_FIELDS, Refusal } from "@/lib/errors";

const NOT_FOUND = "No such work order in your shop.";

// The work order's build sheet and the figures worked out from its readings.
export const GET = route({ access: { area: "dyno" }, params: ["id"] }, async ({ user, params, db }) => {
  const numbers = await loadBuildNumbers(db, user.shopId, idParam(params.id, NOT_FOUND));
  if (!numbers) throw new Refusal(NOT_FOUND, 404);
  return numbers;
});

// Saves the build sheet as sent (a new entry; the newest is current): every figure checked against
// its unit and range, the compressor map outline checked as the maker's sheet would draw it.
export const POST = route(
  {
    access: { area: "dyno" },
    params: ["id"],
    body: json(z.object({ figures: z.record(z.string(), z.unknown()), fuel: z.unknown().optional(), mapOutline: z.unknown().optional() })),
  },
  async ({ user, params, body, db }) => {
    const id = idParam(params.id, NOT_FOUND);
    const checked = checkBuildSheet(body);
    if (!checked.ok) throw new Refusal(CHECK_THE_FIELDS, 400, checked.issues);
    const saved = await saveBuildSheet(db, user, id, checked.sheet);
    if (!saved) throw new Refusal(NOT_FOUND, 404);
    if (!saved.ok) throw new Refusal(saved.refused, 409);
    return created({ id: saved.id });
  },
);
