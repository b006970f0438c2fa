"use client";

import { useRouter } from "next/navigation";
import { useMemo, useState } from "react";
import { readTemplateFile } from "@/lib/procedures/template-file";
import { api, ApiError } from "@/app/ui/api-client";
import { buttonClass, FormMessage } from "@/app/ui/form-field";

// The template as a JSON document, checked on every keystroke against the same schema as the
// import; saving writes a new version.
export function TemplateEditor({ initial, isNew }: { initial: string; isNew: boolean }) {
  const router = useRouter();
  const [text, setText] = useState(initial);
  const [message, setMessage] = useState<{ error?: string; ok?: string }>({});
  const [busy, setBusy] = useState(false);
  const check = useMemo(() => readTemplateFile(text), [text]);
  const single = check.ok && check.documents.length === 1 ? check.documents[0] : null;

  async function save() {
    if (!single) return;
    setBusy(true);
    try {
      const r = await api<{ key: string; version: number }>("POST", "/api/office/templates", single);
      setMessage({ ok: `Saved as version ${r.version}.` });
      router.push(`/office/templates/edit?key=${encodeURIComponent(single.key)}`);
      router.refresh();
    } catch (e) {
      setMessage({ error: e instanceof ApiError && e.issues.length ? `${e.message} ${e.issues.map((i) => `${i.path}: ${i.message}`).join("; ")}` : (e as Error).message });
    } finally {
      setBusy(false);
    }
  }

  const stats = single ? single.stages.reduce((a, s) => ({ stages: a.stages + 1, steps: a.steps + s.steps.length, torque: a.torque + s.steps.reduce((n, st) => n + st.torque.length, 0), readings: a.readings + s.steps.reduce((n, st) => n + st.measurements.length, 0), timers: a.timers + s.steps.filter((st) => st.timer).length }), { stages: 0, steps: 0, torque: 0, readings: 0, timers: 0 }) : null;
  return (
    <div className="grid gap-4 lg:grid-cols-[3fr_2fr]">
      <label className="flex flex-col gap-1 font-bold">
        Template document
        <textarea value={text} onChange={(e) => setText(e.target.value)} spellCheck={false} rows={30} className="rounded-lg border-2 border-steel-700 bg-white p-3 font-mono text-sm font-normal" aria-describedby="template-check" data-testid="template-json" />
      </label>
      <div id="template-check" className="grid content-start gap-3">
        {check.ok && single ? (
          <div className="rounded-lg border-2 border-pass bg-pass-light p-3" data-testid="template-valid">
            <p className="font-bold text-pass">✔ Valid template</p>
            <p>
              {single.name} · {stats!.stages} stages, {stats!.steps} steps, {stats!.torque} torque specs, {stats!.readings} measurement specs, {stats!.timers} timers
            </p>
          </div>
        ) : (
          <div className="rounded-lg border-2 border-fail bg-fail-light p-3" data-testid="template-problems">
            <p className="font-bold text-fail">✖ Not valid yet</p>
            <ul className="mt-1 list-disc pl-5 font-mono text-sm">
              {check.ok ? <li>(file): the editor saves one template at a time; import a bundle instead</li> : check.problems.slice(0, 30).map((p, i) => <li key={i}>{p.path}: {p.message}</li>)}
            </ul>
          </div>
        )}
        <FormMessage error={message.error} ok={message.ok} />
        <div>
          <button type="button" className={buttonClass} disabled={!single || busy} onClick={save}>
            {isNew ? "Save the template" : "Save as a new version"}
          </button>
        </div>
        <p className="text-sm">Fields: see “Template format” in the README. Figures in shipped examples are invented; use the maker&apos;s service data.</p>
      </div>
    </div>
  );
}
