import { getObject, putObject } from "@/app/_server/object-store";
import { photoBytes, photoUpload } from "../handlers";

const store = { put: putObject, get: getObject };

// POST: the bytes of a step photo queued on a tablet. GET: the photo, for the bench and review.
export const POST = photoUpload(store);
export const GET = photoBytes(store);
