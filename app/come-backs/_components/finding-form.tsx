"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { api, ApiError } from "@/app/ui/api-client";
import { buttonClass, Field, FormMessage, inputClass } from "@/app/ui/form-field";
import { CAUSE_LABELS, COME_BACK_CAUSES } from "@/lib/aftercare/come-backs";

// Records a finding on a come-back; with one on record, the new one replaces it (both stay on file).
export function FindingForm({ comeBackId, replacesId }: { comeBackId: string; replacesId: string | null }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [fields, setFields] = useState<Record<string, string>>({});
  const [busy, setBusy] = useState(false);
  async function onSubmit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = e.currentTarget;
    const f = new FormData(form);
    setBusy(true);
    setError(null);
    setFields({});
    try {
      await api("POST", `/api/come-backs/${comeBackId}/findings`, {
        underWarranty: f.get("underWarranty") === "yes",
        cause: String(f.get("cause") ?? ""),
        note: String(f.get("note") ?? ""),
        replacesId,
      });
      form.reset();
      router.refresh();
    } catch (err) {
      setError((err as Error).message);
      if (err instanceof ApiError) setFields(Object.fromEntries(err.issues.map((i) => [i.path, i.message])));
    } finally {
      setBusy(false);
    }
  }
  return (
    <form onSubmit={onSubmit} noValidate className="grid max-w-2xl gap-4" data-testid="finding-form">
      <Field label="What caused it" name="cause" error={fields.cause}>
        <select id="cause" name="cause" className={inputClass} defaultValue="">
          <option value="" disabled>
            Choose…
          </option>
          {COME_BACK_CAUSES.map((c) => (
            <option key={c} value={c}>
              {CAUSE_LABELS[c]}
            </option>
          ))}
        </select>
      </Field>
      <fieldset className="flex flex-wrap gap-4">
        <legend className="mb-1 text-base font-bold">Done under warranty?</legend>
        <label className="flex min-h-16 items-center gap-3 rounded-lg border-2 border-steel-700 px-4 text-lg">
          <input type="radio" name="underWarranty" value="yes" className="h-6 w-6" /> Yes, under warranty
        </label>
        <label className="flex min-h-16 items-center gap-3 rounded-lg border-2 border-steel-700 px-4 text-lg">
          <input type="radio" name="underWarranty" value="no" defaultChecked className="h-6 w-6" /> No, charged
        </label>
      </fieldset>
      <Field label="What was found" name="note" error={fields.note} hint="At most 2000 characters.">
        <textarea id="note" name="note" rows={3} maxLength={2000} className={`${inputClass} py-2`} />
      </Field>
      <FormMessage error={error} />
      <button type="submit" disabled={busy} className={`${buttonClass} min-h-16`}>
        {busy ? "Recording…" : replacesId ? "Record a new finding (replaces the one above)" : "Record the finding"}
      </button>
    </form>
  );
}
