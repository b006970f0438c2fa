import { NextResponse } from "next/server";
import { z } from "zod";
import { guarded } from "@/app/_server/route-helpers";
import { db } from "@/db/setup/client";
import { bikesWithPart } from "@/db/office/parts";

const query = z.object({
  code: z.string().trim().min(1, "enter a batch, serial or part number").max(80),
  field: z.enum(["batch", "serial", "part_number"]).default("batch"),
});

// Which bikes got batch (or serial, or part number) X.
export const GET = guarded("office", async ({ req, user }) => {
  const q = query.parse(Object.fromEntries(new URL(req.url).searchParams));
  return NextResponse.json({ fittings: await bikesWithPart(db(), user.shopId, q.code, q.field) });
});
