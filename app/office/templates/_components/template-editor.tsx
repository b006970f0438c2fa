"use client";

import { useRouter } from "next/navigation";
import { useMemo, useState } from "react";
import { readTemplateFile } from "@/lib/procedures/template-file";
import { templateDocumentSchema, type TemplateDocumentInput } from "@/lib/procedures/template-schema";
import { api, ApiError } from "@/app/ui/api-client";
import { issuesOf } from "@/lib/zod-issues";
import { buttonClass, FormMessage, quietButtonClass } from "@/app/ui/form-field";
import { TemplateForm } from "./template-form";

type Doc = TemplateDocumentInput;

// Template editing: a structured form (default) or the JSON document, both checked on every change
// against the same schema as the import. Saving writes a new version.
export function TemplateEditor({ initial, isNew }: { initial: Doc; isNew: boolean }) {
  const router = useRouter();
  const [mode, setMode] = useState<"form" | "json">("form");
  const [doc, setDoc] = useState<Doc>(initial);
  const [text, setText] = useState(() => JSON.stringify(initial, null, 2));
  const [message, setMessage] = useState<{ error?: string; ok?: string }>({});
  const [busy, setBusy] = useState(false);

  const check = useMemo(() => {
    if (mode === "json") {
      const r = readTemplateFile(text);
      if (!r.ok) return { doc: null, problems: r.issues, fieldErrors: {} };
      if (r.documents.length !== 1)
        return {
          doc: null,
          problems: [{ path: "(file)", message: "the editor saves one template at a time; import a bundle instead" }],
          fieldErrors: {},
        };
      return { doc: r.documents[0], problems: [], fieldErrors: {} };
    }
    const r = templateDocumentSchema.safeParse(doc);
    if (r.success) return { doc: r.data, problems: [], fieldErrors: {} };
    const fieldErrors: Record<string, string> = {};
    for (const i of issuesOf(r.error)) fieldErrors[i.path] ??= i.message;
    return { doc: null, problems: issuesOf(r.error, { pathStyle: "document" }), fieldErrors };
  }, [mode, doc, text]);

  function switchTo(next: "form" | "json") {
    if (next === mode) return;
    if (next === "json") {
      setText(JSON.stringify(doc, (_k, v) => (typeof v === "number" && Number.isNaN(v) ? null : v), 2));
      setMode("json");
      return;
    }
    try {
      const raw = JSON.parse(text);
      if (!raw || typeof raw !== "object" || !Array.isArray(raw.stages)) throw new Error("it has no stages list");
      setDoc(raw as Doc);
      setMode("form");
      setMessage({});
    } catch (e) {
      setMessage({ error: `The JSON cannot be shown as a form yet: ${(e as Error).message}` });
    }
  }

  async function save() {
    if (!check.doc) return;
    setBusy(true);
    try {
      const r = await api<{ key: string; version: number }>("POST", "/api/office/templates", check.doc);
      setMessage({ ok: `Saved as version ${r.version}.` });
      if (isNew) router.push(`/office/templates/edit?key=${encodeURIComponent(r.key)}`);
      router.refresh();
    } catch (e) {
      setMessage({
        error:
          e instanceof ApiError && e.issues.length
            ? `${e.message} ${e.issues.map((i) => `${i.path}: ${i.message}`).join("; ")}`
            : (e as Error).message,
      });
    } finally {
      setBusy(false);
    }
  }

  const d = check.doc;
  const stats = d
    ? {
        stages: d.stages.length,
        steps: d.stages.reduce((n, s) => n + s.steps.length, 0),
        torque: d.stages.flatMap((s) => s.steps).reduce((n, st) => n + st.torque.length, 0),
        readings: d.stages.flatMap((s) => s.steps).reduce((n, st) => n + st.measurements.length, 0),
        timers: d.stages.flatMap((s) => s.steps).filter((st) => st.timer).length,
      }
    : null;
  return (
    <div className="grid gap-4 lg:grid-cols-[3fr_2fr]">
      <div>
        <div role="tablist" aria-label="Editor" className="mb-3 flex gap-2">
          <button
            type="button"
            role="tab"
            aria-selected={mode === "form"}
            className={mode === "form" ? buttonClass : quietButtonClass}
            onClick={() => switchTo("form")}
          >
            Form
          </button>
          <button
            type="button"
            role="tab"
            aria-selected={mode === "json"}
            className={mode === "json" ? buttonClass : quietButtonClass}
            onClick={() => switchTo("json")}
          >
            JSON
          </button>
        </div>
        {mode === "form" ? (
          <TemplateForm doc={doc} onChange={setDoc} errors={check.fieldErrors} />
        ) : (
          <label className="flex flex-col gap-1 font-bold">
            Template document
            <textarea
              value={text}
              onChange={(e) => setText(e.target.value)}
              spellCheck={false}
              rows={30}
              className="rounded-lg border-2 border-steel-700 bg-white p-3 font-mono text-sm font-normal"
              aria-describedby="template-check"
              data-testid="template-json"
            />
          </label>
        )}
      </div>
      <div id="template-check" className="grid content-start gap-3 lg:sticky lg:top-4">
        {d && stats ? (
          <div className="rounded-lg border-2 border-pass bg-pass-light p-3" data-testid="template-valid">
            <p className="font-bold text-pass">✔ Valid template</p>
            <p>
              {d.name} · {stats.stages} stages, {stats.steps} steps, {stats.torque} torque specs, {stats.readings} measurement specs,{" "}
              {stats.timers} timers
            </p>
          </div>
        ) : (
          <div className="rounded-lg border-2 border-fail bg-fail-light p-3" data-testid="template-problems">
            <p className="font-bold text-fail">✖ Not valid yet</p>
            <ul className="mt-1 list-disc pl-5 font-mono text-sm">
              {check.problems.slice(0, 30).map((p, i) => (
                <li key={i}>
                  {p.path}: {p.message}
                </li>
              ))}
            </ul>
          </div>
        )}
        <FormMessage error={message.error} ok={message.ok} />
        <div>
          <button type="button" className={buttonClass} disabled={!d || busy} onClick={save}>
            {isNew ? "Save the template" : "Save as a new version"}
          </button>
        </div>
        <p className="text-sm">
          Fields: see “Template format” in the README. Figures in shipped examples are invented; use the maker&apos;s service data.
        </p>
      </div>
    </div>
  );
}
