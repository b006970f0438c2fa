import { NextResponse } from "next/server";
import { filesOf, checkPhotos, storePhotos } from "@/app/_server/photos";
import { guarded } from "@/app/_server/route-helpers";
import { db } from "@/db/setup/client";
import { bookIn, pageWorkOrders } from "@/db/shop/work-orders";
import { intakeSchema, pageQuerySchema } from "@/lib/office/schemas";

// GET: one page of work orders (search q, status, sort, dir, page, size). POST: book a bike in
// (multipart: bikeId, title, complaint, odometerKm, photos[]).
export const GET = guarded("office", async ({ req, user }) => {
  const q = pageQuerySchema.parse(Object.fromEntries(new URL(req.url).searchParams));
  const { rows, total } = await pageWorkOrders(db(), user.shopId, q);
  return NextResponse.json({ workOrders: rows, total, page: q.page, size: q.size });
});

export const POST = guarded("office", async ({ req, user }) => {
  const form = await req.formData();
  const input = intakeSchema.parse({ bikeId: form.get("bikeId"), title: form.get("title"), complaint: form.get("complaint"), odometerKm: form.get("odometerKm") });
  const photos = filesOf(form);
  checkPhotos(photos);
  const wo = await bookIn(db(), user.shopId, user.id, input);
  const note = await db().selectFrom("work_order_notes").select("id").where("work_order_id", "=", wo.id).where("kind", "=", "intake").executeTakeFirstOrThrow();
  let warning: string | undefined;
  try {
    await storePhotos(db(), { shopId: user.shopId, userId: user.id, workOrderId: wo.id, bikeId: input.bikeId, noteId: note.id, purpose: "intake" }, photos);
  } catch (e) {
    warning = `The work order is saved, but the photos could not be stored (${(e as Error).message}). Add them again from the work order.`;
  }
  return NextResponse.json({ id: wo.id, number: wo.number, warning }, { status: 201 });
});
