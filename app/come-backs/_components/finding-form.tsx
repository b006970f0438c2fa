"use client";

import { useRouter } from "next/navigation";
import { api } from "@/app/ui/api-client";
import { buttonClass, Field, FormMessage, inputClass } from "@/app/ui/form-field";
import { useCheckedForm } from "@/app/ui/use-checked-form";
import { CAUSE_LABELS, COME_BACK_CAUSES, comeBackFindingSchema } from "@/lib/aftercare/come-backs";

// Records a finding on a come-back; with one on record, the new one replaces it (both stay on file).
export function FindingForm({ comeBackId, replacesId }: { comeBackId: string; replacesId: string | null }) {
  const router = useRouter();
  const { errors: fields, message, busy, submit } = useCheckedForm();
  async function onSubmit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = e.currentTarget;
    const f = new FormData(form);
    const values = {
      underWarranty: f.get("underWarranty") === "yes",
      cause: String(f.get("cause") ?? ""),
      note: String(f.get("note") ?? ""),
      replacesId,
    };
    const sent = await submit(comeBackFindingSchema, values, async (data) => {
      await api("POST", `/api/come-backs/${comeBackId}/findings`, data);
    });
    if (sent) {
      form.reset();
      router.refresh();
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
      <FormMessage error={message.error} />
      <button type="submit" disabled={busy} className={`${buttonClass} min-h-16`}>
        {busy ? "Recording…" : replacesId ? "Record a new finding (replaces the one above)" : "Record the finding"}
      </button>
    </form>
  );
}
