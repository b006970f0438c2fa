"use client";

import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { api, ApiError, type FieldIssue } from "@/app/ui/api-client";
import { buttonClass, FormMessage } from "@/app/ui/form-field";

// Import a template file (one template or a bundle). Every template in it is written, or none;
// problems come back with the place in the file and what is wrong.
export function TemplateImport() {
  const router = useRouter();
  const [problems, setProblems] = useState<FieldIssue[]>([]);
  const [message, setMessage] = useState<{ error?: string; ok?: string }>({});
  const [busy, setBusy] = useState(false);
  async function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const file = (new FormData(e.currentTarget).get("file") as File | null) ?? null;
    setProblems([]);
    if (!file || file.size === 0) {
      setMessage({ error: "Choose a template file (.json) first." });
      return;
    }
    if (file.size > 1_000_000) {
      setMessage({ error: "The file is larger than 1 MB." });
      return;
    }
    setBusy(true);
    try {
      const r = await api<{ imported: Array<{ key: string; version: number }> }>("POST", "/api/office/templates/import", await file.text());
      setMessage({ ok: `Imported: ${r.imported.map((i) => `${i.key} (version ${i.version})`).join(", ")}.` });
      router.refresh();
    } catch (err) {
      setMessage({ error: (err as Error).message });
      if (err instanceof ApiError) setProblems(err.issues);
    } finally {
      setBusy(false);
    }
  }
  return (
    <form onSubmit={onSubmit} className="grid gap-3" data-testid="template-import">
      <label className="flex flex-col gap-1 font-bold">
        Template file (.json)
        <input name="file" type="file" accept="application/json,.json" className="text-lg font-normal" />
      </label>
      <FormMessage error={message.error} ok={message.ok} />
      {problems.length > 0 && (
        <ul className="list-disc pl-6 font-mono text-base text-fail" data-testid="import-problems">
          {problems.map((p, i) => (
            <li key={i}>
              {p.path}: {p.message}
            </li>
          ))}
        </ul>
      )}
      <div>
        <button type="submit" className={buttonClass} disabled={busy}>
          Import
        </button>
      </div>
    </form>
  );
}
