import { z } from "zod";
import type { FieldIssue } from "../errors";
import { unstorableTexts } from "../safe-values";
import { documentPath, fieldLabel, issuesOf } from "../zod-issues";
import { templateDocumentSchema, type TemplateDocument } from "./template-schema";

// Template files: one "benchtag-template" document, or a bundle of several
// ({ "format": "benchtag-template-bundle", "formatVersion": 1, "templates": [ … ] }).
// Reading a file either gives every document, validated, or the list of problems (path as it reads
// in the file, e.g. "stages[0].steps[2].torque[0].unit" or "(file)", and message); the caller
// imports all of them in one transaction or none.

const templateBundleSchema = z
  .object({
    format: z.literal("benchtag-template-bundle"),
    formatVersion: z.literal(1),
    templates: z.array(templateDocumentSchema).min(1).max(50),
  })
  .strict()
  .superRefine((b, ctx) => {
    const keys = b.templates.map((t) => t.key);
    keys.forEach((k, i) => {
      if (keys.indexOf(k) !== i)
        ctx.addIssue({ code: "custom", message: `template key "${k}" appears twice in the bundle`, path: ["templates", i, "key"] });
    });
  });

type TemplateFileResult = { ok: true; documents: TemplateDocument[] } | { ok: false; issues: FieldIssue[] };

export const MAX_TEMPLATE_FILE_BYTES = 1_000_000;

export function readTemplateFile(text: string): TemplateFileResult {
  if (text.length > MAX_TEMPLATE_FILE_BYTES) return { ok: false, issues: [{ path: "(file)", message: "the file is larger than 1 MB" }] };
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch {
    return { ok: false, issues: [{ path: "(file)", message: "not valid JSON: choose a template file exported from Benchtag (.json)" }] };
  }
  // a NUL, control character or half of an emoji cannot be stored: said here, field by field
  const unstorable = unstorableTexts(raw, (path) => fieldLabel(path));
  if (unstorable.length) return { ok: false, issues: unstorable.map((u) => ({ path: documentPath(u.path), message: u.message })) };
  const format = (raw as { format?: unknown } | null)?.format;
  if (format === "benchtag-template-bundle") {
    const r = templateBundleSchema.safeParse(raw);
    return r.success ? { ok: true, documents: r.data.templates } : { ok: false, issues: issuesOf(r.error, { pathStyle: "document" }) };
  }
  if (format !== "benchtag-template") {
    return { ok: false, issues: [{ path: "format", message: 'expected "benchtag-template" or "benchtag-template-bundle"' }] };
  }
  const r = templateDocumentSchema.safeParse(raw);
  return r.success ? { ok: true, documents: [r.data] } : { ok: false, issues: issuesOf(r.error, { pathStyle: "document" }) };
}
