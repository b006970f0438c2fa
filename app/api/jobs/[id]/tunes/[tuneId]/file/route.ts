import { idParam, route } from "@/app/_server/route";
import { readTuneFile } from "@/app/_server/tune-files";

// The tune file as uploaded, checked against its SHA-256 before it is served.
export const GET = route({ access: { area: "dyno" }, params: ["id", "tuneId"] }, async ({ user, params, db }) => {
  const notFound = "No such tune version on this work order.";
  const tune = await readTuneFile(db, user.shopId, idParam(params.id, notFound), idParam(params.tuneId, notFound));
  return new Response(tune.body as BodyInit, {
    headers: {
      "content-type": tune.contentType,
      "content-disposition": `attachment; filename*=UTF-8''${encodeURIComponent(tune.fileName)}`,
      "x-content-sha256": tune.sha256,
      "cache-control": "no-store",
    },
  });
});
