"use client";

import { issuesOf } from "@/lib/zod-issues";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { useState, type FormEvent } from "react";
import { partFittedSchema } from "@/lib/office/schemas";
import { api, ApiError, fieldErrors } from "@/app/ui/api-client";
import { formatDayTime } from "@/lib/format/dates";
import { Field, FormMessage, inputClass, quietButtonClass } from "@/app/ui/form-field";
import type { WorkOrderData } from "./types";

// Parts fitted to this job, with supplier, serial or batch, the step that fitted them and who did;
// those recorded at the bench say so, with any flag the sync raised.
export function PartsPanel({ data }: { data: WorkOrderData }) {
  const qc = useQueryClient();
  const wo = data.workOrder;
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [message, setMessage] = useState<{ error?: string; ok?: string }>({});
  const add = useMutation({
    mutationFn: (body: unknown) => api<{ id: string; stockNote: string | null }>("POST", `/api/office/work-orders/${wo.id}/parts`, body),
    onSuccess: (r) => {
      // a part kept in stock is drawn from the shelf; what the shelf could not cover is said
      setMessage({ ok: r.stockNote ? `Part recorded. ${r.stockNote}` : "Part recorded." });
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
    const f = Object.fromEntries(new FormData(formEl)) as Record<string, string>;
    const body = { ...f, quantity: Number(f.quantity || 1), stepId: f.stepId || null };
    const p = partFittedSchema.safeParse(body);
    if (!p.success) {
      setErrors(fieldErrors(issuesOf(p.error)));
      setMessage({ error: "Check the marked fields." });
      return;
    }
    setErrors({});
    add.mutate(p.data, { onSuccess: () => formEl.reset() });
  }
  return (
    <section className="rounded-xl border-2 border-steel-300 bg-white p-4" aria-labelledby="parts-heading">
      <h2 id="parts-heading" className="text-2xl font-bold">
        Parts fitted
      </h2>
      {wo.parts.length === 0 ? (
        <p className="mt-2">None recorded yet.</p>
      ) : (
        <ul className="mt-2 space-y-1">
          {wo.parts.map((p) => (
            <li key={p.id} className={`text-lg ${p.withdrawn ? "text-steel-700" : ""}`} data-testid="part-fitted">
              <span className={p.withdrawn ? "line-through" : ""}>
                {p.quantity} × <span className="font-mono">{p.partNumber}</span> {p.description}
              </span>{" "}
              {p.supplier && `· ${p.supplier}`} {p.serial && <span className="font-mono">· serial {p.serial}</span>}{" "}
              {p.batch && <span className="font-mono">· batch {p.batch}</span>} {p.stepTitle && `· at "${p.stepTitle}"`}{" "}
              {p.fittedByName && (p.atBench ? `· fitted by ${p.fittedByName} · recorded at the bench` : `· recorded by ${p.fittedByName}`)}
              {p.flagReason && <span className="block font-bold text-warn">⚑ Flagged for the supervisor: {p.flagReason}</span>}
              {p.withdrawn && (
                <span className="block font-bold text-fail">
                  ⊘ Withdrawn by {p.withdrawn.by}, {formatDayTime(p.withdrawn.at)}: “{p.withdrawn.reason}” — no longer counted as fitted
                </span>
              )}
            </li>
          ))}
        </ul>
      )}
      <details className="mt-3">
        <summary className="cursor-pointer text-lg font-bold">Record a part</summary>
        <form onSubmit={onSubmit} noValidate className="mt-3 grid gap-3 md:grid-cols-3" data-testid="part-form">
          <Field label="Part number" name="part-partNumber" error={errors.partNumber}>
            <input id="part-partNumber" name="partNumber" className={`${inputClass} font-mono`} aria-invalid={Boolean(errors.partNumber)} />
          </Field>
          <Field label="Description" name="part-description" error={errors.description}>
            <input id="part-description" name="description" className={inputClass} />
          </Field>
          <Field label="Supplier" name="part-supplier" error={errors.supplier}>
            <input id="part-supplier" name="supplier" className={inputClass} />
          </Field>
          <Field label="Serial" name="part-serial" error={errors.serial}>
            <input id="part-serial" name="serial" className={`${inputClass} font-mono`} />
          </Field>
          <Field label="Batch" name="part-batch" error={errors.batch}>
            <input id="part-batch" name="batch" className={`${inputClass} font-mono`} />
          </Field>
          <Field label="Quantity" name="part-quantity" error={errors.quantity}>
            <input id="part-quantity" name="quantity" defaultValue="1" inputMode="numeric" className={`${inputClass} w-24 font-mono`} />
          </Field>
          <Field label="Fitted at step" name="part-stepId" error={errors.stepId}>
            <select id="part-stepId" name="stepId" className={inputClass}>
              <option value="">Not tied to a step</option>
              {data.steps.map((s) => (
                <option key={`${s.position}-${s.id}`} value={s.id}>
                  {s.stageTitle} — {s.title}
                </option>
              ))}
            </select>
          </Field>
          <div className="md:col-span-3">
            <FormMessage error={message.error} ok={message.ok} />
            <button type="submit" className={`${quietButtonClass} mt-2`} disabled={add.isPending}>
              Record part
            </button>
          </div>
        </form>
      </details>
    </section>
  );
}
