"use client";

import { issuesOf } from "@/lib/zod-issues";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { useState, type FormEvent } from "react";
import { noteSchema } from "@/lib/office/schemas";
import { api, ApiError, fieldErrors } from "@/app/ui/api-client";
import { formatDayTime } from "@/lib/format/dates";
import { Field, FormMessage, inputClass, quietButtonClass } from "@/app/ui/form-field";
import type { WorkOrderData } from "./types";

const KIND = { intake: "At intake", teardown: "Teardown finding", general: "Note" } as const;

// Intake notes and teardown findings, each with its photos; add a finding with photos.
export function NotesPanel({ data }: { data: WorkOrderData }) {
  const qc = useQueryClient();
  const wo = data.workOrder;
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [message, setMessage] = useState<{ error?: string; ok?: string }>({});
  const add = useMutation({
    mutationFn: (form: FormData) => api<{ warning?: string }>("POST", `/api/office/work-orders/${wo.id}/notes`, form),
    onSuccess: (r) => {
      setMessage(r.warning ? { error: r.warning } : { ok: "Finding saved." });
      void qc.invalidateQueries({ queryKey: ["work-order", wo.id] });
    },
    onError: (e) => {
      if (e instanceof ApiError) setErrors(fieldErrors(e.issues));
      setMessage({ error: (e as Error).message });
    },
  });
  function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const formEl = e.currentTarget;
    const form = new FormData(formEl);
    const p = noteSchema.safeParse({ kind: form.get("kind"), body: form.get("body") });
    if (!p.success) {
      setErrors(fieldErrors(issuesOf(p.error)));
      setMessage({ error: "Check the marked fields." });
      return;
    }
    setErrors({});
    add.mutate(form, { onSuccess: () => formEl.reset() });
  }
  const photosOf = (noteId: string) => wo.photos.filter((p) => p.noteId === noteId);
  return (
    <section className="rounded-xl border-2 border-steel-300 bg-white p-4" aria-labelledby="notes-heading">
      <h2 id="notes-heading" className="text-2xl font-bold">
        Findings and photos
      </h2>
      <ul className="mt-2 space-y-3">
        {wo.notes.map((n) => (
          <li key={n.id} className="border-l-4 border-steel-700 pl-3" data-testid="note">
            <p className="text-sm text-steel-700">
              {KIND[n.kind as keyof typeof KIND] ?? n.kind} · {n.authorName ?? "—"} · {formatDayTime(n.at)}
            </p>
            <p className="text-lg whitespace-pre-wrap">{n.body}</p>
            {photosOf(n.id).length > 0 && (
              <div className="mt-2 flex flex-wrap gap-2">
                {photosOf(n.id).map((p) => (
                  <a key={p.id} href={`/api/office/attachments/${p.id}`} target="_blank" rel="noreferrer">
                    {/* eslint-disable-next-line @next/next/no-img-element */}
                    <img
                      src={`/api/office/attachments/${p.id}`}
                      alt={p.caption || "photo"}
                      className="h-24 w-32 rounded border-2 border-steel-300 object-cover"
                      data-testid="note-photo"
                    />
                  </a>
                ))}
              </div>
            )}
          </li>
        ))}
      </ul>
      <form onSubmit={onSubmit} noValidate className="mt-4 grid gap-3" data-testid="note-form">
        <div className="grid gap-3 md:grid-cols-[auto_1fr]">
          <Field label="Kind" name="note-kind">
            <select id="note-kind" name="kind" className={inputClass} defaultValue="teardown">
              <option value="teardown">Teardown finding</option>
              <option value="general">Note</option>
            </select>
          </Field>
          <Field label="What was found" name="note-body" error={errors.body}>
            <textarea id="note-body" name="body" rows={2} className={`${inputClass} py-2`} aria-invalid={Boolean(errors.body)} />
          </Field>
        </div>
        <Field label="Photos" name="note-photos" error={errors.photos}>
          <input id="note-photos" name="photos" type="file" accept="image/jpeg,image/png,image/webp" multiple className="text-lg" />
        </Field>
        <FormMessage error={message.error} ok={message.ok} />
        <div>
          <button type="submit" className={quietButtonClass} disabled={add.isPending}>
            Save finding
          </button>
        </div>
      </form>
    </section>
  );
}
