import { created, route, text } from "@/app/_server/route";
import { importTemplateDocuments } from "@/db/templates/documents";
import { Refusal } from "@/lib/errors";
import { MAX_TEMPLATE_FILE_BYTES, readTemplateFile } from "@/lib/procedures/template-file";

// Import: the file's text as the body. All templates in it are written, or none (422 with each
// problem's place in the file and what is wrong).
export const POST = route(
  {
    access: { area: "templates" },
    body: text(["application/json"], MAX_TEMPLATE_FILE_BYTES, { tooLargeHint: "A template file may be 1 MB at most." }),
  },
  async ({ user, body, db }) => {
    const r = readTemplateFile(body);
    if (!r.ok) throw new Refusal("The file was not imported: nothing was written.", 422, r.issues);
    return created({ imported: await importTemplateDocuments(db, user.shopId, user.id, r.documents) });
  },
);
