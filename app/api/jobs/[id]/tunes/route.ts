import { created, idParam, KIB, multipart, route } from "@/app/_server/route";
import { storeTuneVersion } from "@/app/_server/tune-files";
import { findDynoWorkOrder } from "@/db/records/dyno";
import { listTuneVersions } from "@/db/records/tunes";
import { TUNE_FILE_MAX_BYTES } from "@/lib/dyno/tune-version";
import { Refusal } from "@/lib/errors";
import { closedRecordRefusal } from "@/lib/work-orders/closed-record";

const NOT_FOUND = "No such work order in your shop.";

// The work order's tune versions, oldest first.
export const GET = route({ access: { area: "dyno" }, params: ["id"] }, async ({ user, params, db }) => ({
  tunes: await listTuneVersions(db, user.shopId, idParam(params.id, NOT_FOUND)),
}));

// A new tune version: multipart form with `file` (any file, at most 16 MiB), `label` and `notes`.
// The body is counted while it streams in and refused (413) past the file limit plus the fields.
export const POST = route(
  {
    access: { area: "dyno" },
    params: ["id"],
    body: {
      ...multipart({ maxBytes: TUNE_FILE_MAX_BYTES + 64 * KIB, maxFileBytes: TUNE_FILE_MAX_BYTES, maxFiles: 1, maxFields: 4 }),
      tooLargeHint: "A tune file may be at most 16 MiB.",
    },
  },
  async ({ user, params, body, db }) => {
    const id = idParam(params.id, NOT_FOUND);
    const job = await findDynoWorkOrder(db, user.shopId, id);
    if (!job) throw new Refusal(NOT_FOUND, 404);
    // said before the file is stored; checked again where the version is written (db/records/tunes.ts)
    const closed = closedRecordRefusal(job, "tune version");
    if (closed) throw new Refusal(closed, 409, [{ path: "workOrder", message: closed }]);
    return created(await storeTuneVersion(db, user, id, body));
  },
);
