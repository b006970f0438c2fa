import { checkPhotos, filesOf, PHOTO_FORM, storePhotos } from "@/app/_server/photos";
import { photoStoreTrouble } from "@/app/_server/photo-trouble";
import { created, idParam, multipart, route } from "@/app/_server/route";
import { addNote } from "@/db/shop/work-orders";
import { noteSchema } from "@/lib/office/schemas";

// A finding (teardown or general note) with photos, multipart: kind, body, photos[].
export const POST = route(
  { access: { area: "office" }, params: ["id"], body: multipart(PHOTO_FORM) },
  async ({ user, params, body: form, db }) => {
    const id = idParam(params.id);
    const input = noteSchema.parse({ kind: form.get("kind") ?? "teardown", body: form.get("body") });
    const photos = await checkPhotos(filesOf(form));
    const note = await addNote(db, user.shopId, user.id, id, input.kind, input.body);
    let warning: string | undefined;
    try {
      await storePhotos(
        db,
        {
          shopId: user.shopId,
          userId: user.id,
          workOrderId: id,
          bikeId: null,
          noteId: note.id,
          purpose: input.kind === "intake" ? "intake" : "teardown",
        },
        photos,
      );
    } catch (e) {
      warning = `The note is saved, but the photos could not be stored (${photoStoreTrouble(e)}). Add them again.`;
    }
    return created({ id: note.id, warning });
  },
);
