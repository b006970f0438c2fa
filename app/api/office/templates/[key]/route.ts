import { NextResponse } from "next/server";
import { z } from "zod";
import { guarded } from "@/app/_server/route-helpers";
import { db } from "@/db/setup/client";
import { loadTemplateDocument } from "@/db/templates/documents";
import { Refusal } from "@/lib/office/refusal";

const q = z.object({ version: z.coerce.number().int().positive().optional(), download: z.enum(["1"]).optional() });

// Export: the template document of one version (latest when not given), as JSON; ?download=1 as a file.
export const GET = guarded<{ key: string }>("templates", async ({ req, user, params }) => {
  const { version, download } = q.parse(Object.fromEntries(new URL(req.url).searchParams));
  const doc = await loadTemplateDocument(db(), user.shopId, decodeURIComponent(params.key), version);
  if (!doc) throw new Refusal("No such template or version.", 404);
  const headers: Record<string, string> = {};
  if (download) headers["content-disposition"] = `attachment; filename="${doc.key}${version ? `-v${version}` : ""}.benchtag-template.json"`;
  return new NextResponse(JSON.stringify(doc, null, 2), { headers: { "content-type": "application/json", ...headers } });
});
