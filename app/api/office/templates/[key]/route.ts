import { z } from "zod";
import { route } from "@/app/_server/route";
import { loadTemplateDocument } from "@/db/templates/documents";
import { Refusal } from "@/lib/errors";
import { TEMPLATE_KEY_PATTERN } from "@/lib/procedures/template-schema";
import { INT4_MAX } from "@/lib/safe-values";

// A version is a whole number from 1 to the most the database's integer holds.
const query = z.object({
  version: z.coerce.number().int().positive().max(INT4_MAX).optional(),
  download: z.enum(["1"]).optional(),
});
const NOT_FOUND = "No such template or version.";

// Export: the template document of one version (latest when not given), as JSON; ?download=1 as a file.
export const GET = route({ access: { area: "templates" }, params: ["key"], query }, async ({ user, params, query, db }) => {
  const { version, download } = query;
  // the path's key as the router decoded it; a key no template can have names none
  if (!TEMPLATE_KEY_PATTERN.test(params.key)) throw new Refusal(NOT_FOUND, 404);
  const doc = await loadTemplateDocument(db, user.shopId, params.key, version);
  if (!doc) throw new Refusal(NOT_FOUND, 404);
  const headers: Record<string, string> = {};
  if (download) headers["content-disposition"] = `attachment; filename="${doc.key}${version ? `-v${version}` : ""}.benchtag-template.json"`;
  return new Response(JSON.stringify(doc, null, 2), { headers: { "content-type": "application/json", ...headers } });
});
