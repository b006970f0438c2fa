import { NextResponse } from "next/server";
import { checkPhotos, filesOf, storePhotos } from "@/app/_server/photos";
import { guarded, idFrom } from "@/app/_server/route-helpers";
import { db } from "@/db/setup/client";
import { addNote } from "@/db/shop/work-orders";
import { noteSchema } from "@/lib/office/schemas";

// A finding (teardown or general note) with photos, multipart: kind, body, photos[].
export const POST = guarded<{ id: string }>("office", async ({ req, user, params }) => {
  const id = idFrom(params.id);
  const form = await req.formData();
  const input = noteSchema.parse({ kind: form.get("kind") ?? "teardown", body: form.get("body") });
  const photos = filesOf(form);
  checkPhotos(photos);
  const note = await addNote(db(), user.shopId, user.id, id, input.kind, input.body);
  let warning: string | undefined;
  try {
    await storePhotos(db(), { shopId: user.shopId, userId: user.id, workOrderId: id, bikeId: null, noteId: note.id, purpose: input.kind === "intake" ? "intake" : "teardown" }, photos);
  } catch (e) {
    warning = `The note is saved, but the photos could not be stored (${(e as Error).message}).`;
  }
  return NextResponse.json({ id: note.id, warning }, { status: 201 });
});
