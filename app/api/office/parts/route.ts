import { z } from "zod";
import { route } from "@/app/_server/route";
import { bikesWithPart } from "@/db/office/parts";

const query = z.object({
  code: z.string().trim().min(1, "enter a batch, serial or part number").max(80),
  field: z.enum(["batch", "serial", "part_number"]).default("batch"),
});

// Which bikes got batch (or serial, or part number) X.
export const GET = route({ access: { area: "office" }, query }, async ({ user, query, db }) => ({
  fittings: await bikesWithPart(db, user.shopId, query.code, query.field),
}));
