import { created, json, route } from "@/app/_server/route";
import { importTemplateDocuments, templatesWithVersions } from "@/db/templates/documents";
import { MAX_TEMPLATE_FILE_BYTES } from "@/lib/procedures/template-file";
import { templateDocumentSchema } from "@/lib/procedures/template-schema";

// GET: templates with their versions. POST: save an edited document as a new version.
export const GET = route({ access: { area: "templates" } }, async ({ user, db }) => ({
  templates: await templatesWithVersions(db, user.shopId),
}));

export const POST = route(
  { access: { area: "templates" }, body: json(templateDocumentSchema, { maxBytes: MAX_TEMPLATE_FILE_BYTES }) },
  async ({ user, body, db }) => {
    const [written] = await importTemplateDocuments(db, user.shopId, user.id, [body]);
    return created(written);
  },
);
