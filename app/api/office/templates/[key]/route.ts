import { z } from "zod";
import { route } from "@/app/_server/route";
import { loadTemplateDocument } from "@/db/templates/documents";
import { Refusal } from "@/lib/errors";

const query = z.object({ version: z.coerce.number().int().positive().optional(), download: z.enum(["1"]).optional() });

// Export: the template document of one version (latest when not given), as JSON; ?download=1 as a file.
export const GET = route({ access: { area: "templates" }, params: ["key"], query }, async ({ user, params, query, db }) => {
  const { version, download } = query;
  const doc = await loadTemplateDocument(db, user.shopId, decodeURIComponent(params.key), version);
  if (!doc) throw new Refusal("No such template or version.", 404);
  const headers: Record<string, string> = {};
  if (download) headers["content-disposition"] = `attachment; filename="${doc.key}${version ? `-v${version}` : ""}.benchtag-template.json"`;
  return new Response(JSON.stringify(doc, null, 2), { headers: { "content-type": "application/json", ...headers } });
});
