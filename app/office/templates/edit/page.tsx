import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { requirePageArea } from "@/app/_server/session";
import { AppFrame } from "@/app/ui/app-frame";
import { db } from "@/db/setup/client";
import { loadTemplateDocument } from "@/db/templates/documents";
import { TEMPLATE_KEY_PATTERN, type TemplateDocumentInput } from "@/lib/procedures/template-schema";
import { TemplateEditor } from "../_components/template-editor";

export const metadata: Metadata = { title: "Edit template" };

const STARTER: TemplateDocumentInput = {
  format: "benchtag-template",
  formatVersion: 1,
  key: "new-procedure",
  name: "New procedure",
  summary: "",
  exampleOnly: false,
  stages: [
    {
      key: "stage-1",
      title: "First stage",
      steps: [
        {
          key: "step-1",
          title: "First step",
          instructions: "",
          cautions: [],
          requiresPhoto: false,
          torque: [],
          measurements: [],
          timer: null,
        },
      ],
    },
  ],
};

export default async function EditTemplatePage({ searchParams }: { searchParams: Promise<{ key?: string }> }) {
  const user = await requirePageArea("templates");
  const { key } = await searchParams;
  // a key no template can have (a NUL, capitals, too long) names none
  if (key !== undefined && !TEMPLATE_KEY_PATTERN.test(key)) notFound();
  const doc = key ? await loadTemplateDocument(db(), user.shopId, key) : STARTER;
  if (!doc) notFound();
  return (
    <AppFrame user={user} current="/office/templates">
      <p>
        <Link href="/office/templates" className="underline">
          ◀ Templates
        </Link>
      </p>
      <h1 className="mt-2 text-3xl font-bold">{key ? `Edit ${doc.name}` : "New template"}</h1>
      <div className="mt-4">
        <TemplateEditor key={key ?? "new"} initial={doc} isNew={!key} />
      </div>
    </AppFrame>
  );
}
