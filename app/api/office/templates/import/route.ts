import { NextResponse } from "next/server";
import { guarded } from "@/app/_server/route-helpers";
import { db } from "@/db/setup/client";
import { importTemplateDocuments } from "@/db/templates/documents";
import { MAX_TEMPLATE_FILE_BYTES, readTemplateFile } from "@/lib/procedures/template-file";

// Import: the file's text as the body. All templates in it are written, or none (422 with problems).
export const POST = guarded("templates", async ({ req, user }) => {
  const text = await req.text();
  if (text.length > MAX_TEMPLATE_FILE_BYTES) return NextResponse.json({ error: "The file is larger than 1 MB.", problems: [] }, { status: 413 });
  const r = readTemplateFile(text);
  if (!r.ok) return NextResponse.json({ error: "The file was not imported: nothing was written.", problems: r.problems }, { status: 422 });
  const written = await importTemplateDocuments(db(), user.shopId, user.id, r.documents);
  return NextResponse.json({ imported: written }, { status: 201 });
});
