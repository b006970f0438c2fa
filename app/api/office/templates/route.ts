import { NextResponse } from "next/server";
import { guarded, readJson } from "@/app/_server/route-helpers";
import { db } from "@/db/setup/client";
import { importTemplateDocuments, templatesWithVersions } from "@/db/templates/documents";
import { templateDocumentSchema } from "@/lib/procedures/template-schema";

// GET: templates with their versions. POST: save an edited document as a new version.
export const GET = guarded("templates", async ({ user }) => NextResponse.json({ templates: await templatesWithVersions(db(), user.shopId) }));

export const POST = guarded("templates", async ({ req, user }) => {
  const doc = await readJson(req, templateDocumentSchema);
  const [written] = await importTemplateDocuments(db(), user.shopId, user.id, [doc]);
  return NextResponse.json(written, { status: 201 });
});
