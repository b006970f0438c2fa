import { getObject, putObject } from "@/app/_server/object-store";
import { currentUser } from "@/app/_server/session";
import { db } from "@/db/setup/client";
import { photoBytesResponse, uploadPhotoResponse } from "../handlers";

const store = { put: putObject, get: getObject };

// POST: the bytes of a step photo queued on a tablet. GET: the photo, for the bench and review.
export async function POST(request: Request, { params }: { params: Promise<{ id: string }> }): Promise<Response> {
  const { id } = await params;
  return uploadPhotoResponse(await currentUser(), db(), store, id, request);
}

export async function GET(_request: Request, { params }: { params: Promise<{ id: string }> }): Promise<Response> {
  const { id } = await params;
  return photoBytesResponse(await currentUser(), db(), store, id);
}
