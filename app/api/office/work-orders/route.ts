import { checkPhotos, filesOf, PHOTO_FORM, storePhotos } from "@/app/_server/photos";
import { photoStoreTrouble } from "@/app/_server/photo-trouble";
import { created, multipart, route } from "@/app/_server/route";
import { bookIn, pageWorkOrders } from "@/db/shop/work-orders";
import { intakeSchema, pageQuerySchema } from "@/lib/office/schemas";

// GET: one page of work orders (search q, status, sort, dir, page, size). POST: book a bike in
// (multipart: bikeId, title, complaint, odometerKm, photos[]).
export const GET = route({ access: { area: "office" }, query: pageQuerySchema }, async ({ user, query, db }) => {
  const { rows, total } = await pageWorkOrders(db, user.shopId, query);
  return { workOrders: rows, total, page: query.page, size: query.size };
});

export const POST = route({ access: { area: "office" }, body: multipart(PHOTO_FORM) }, async ({ user, body: form, db }) => {
  const input = intakeSchema.parse({
    bikeId: form.get("bikeId"),
    title: form.get("title"),
    complaint: form.get("complaint"),
    odometerKm: form.get("odometerKm"),
  });
  const photos = await checkPhotos(filesOf(form));
  const wo = await bookIn(db, user.shopId, user.id, input);
  let warning: string | undefined;
  try {
    await storePhotos(
      db,
      { shopId: user.shopId, userId: user.id, workOrderId: wo.id, bikeId: input.bikeId, noteId: wo.intakeNoteId, purpose: "intake" },
      photos,
    );
  } catch (e) {
    warning = `The work order is saved, but the photos could not be stored (${photoStoreTrouble(e)}). Add them again from the work order.`;
  }
  return created({ id: wo.id, number: wo.number, warning });
});
