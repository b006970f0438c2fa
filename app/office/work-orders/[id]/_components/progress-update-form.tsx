"use client";

import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { api } from "@/app/ui/api-client";
import { buttonClass, Field, FormMessage, inputClass } from "@/app/ui/form-field";
import { useCheckedForm } from "@/app/ui/use-checked-form";
import { progressUpdateSchema } from "@/lib/customer-contact/schemas";

export interface PickablePhoto {
  id: string;
  label: string;
}

// The office writes a note for the customer and picks photos already on the job to go with it.
// Each photo is a large tick box (the whole tile is the target); the count chosen is said in words.
export function ProgressUpdateForm({ workOrderId, photos }: { workOrderId: string; photos: PickablePhoto[] }) {
  const router = useRouter();
  const { errors, message, busy, submit } = useCheckedForm();
  const [chosen, setChosen] = useState<string[]>([]);

  async function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = e.currentTarget;
    const values = { note: String(new FormData(form).get("note") ?? ""), photoIds: chosen };
    await submit(progressUpdateSchema, values, async (v) => {
      const r = await api<{ warning?: string }>("POST", `/api/office/work-orders/${workOrderId}/progress-updates`, v);
      form.reset();
      setChosen([]);
      router.refresh();
      return r.warning ? `Shared on the customer's page. ${r.warning}` : "Shared on the customer's page and e-mailed to them.";
    });
  }
  const toggle = (id: string) => setChosen((c) => (c.includes(id) ? c.filter((x) => x !== id) : [...c, id]));
  return (
    <form onSubmit={onSubmit} noValidate className="mt-3 grid gap-4" data-testid="progress-update-form">
      <Field label="Note to the customer" name="note" error={errors.note}>
        <textarea id="note" name="note" rows={3} className={`${inputClass} py-2`} aria-invalid={Boolean(errors.note)} />
      </Field>
      <fieldset>
        <legend className="text-base font-bold">
          Photos to share ({chosen.length} chosen of {photos.length})
        </legend>
        {photos.length === 0 && <p className="text-base text-steel-700">No stored photos on this job yet.</p>}
        <div className="mt-2 grid grid-cols-2 gap-4 lg:grid-cols-3">
          {photos.map((p) => {
            const on = chosen.includes(p.id);
            return (
              <label
                key={p.id}
                className={`flex min-h-16 cursor-pointer flex-col gap-2 rounded-lg border-4 p-2 ${on ? "border-steel-900 bg-steel-100" : "border-steel-300 bg-white"}`}
                data-testid="pick-photo"
              >
                {/* eslint-disable-next-line @next/next/no-img-element -- a private photo served by our own route */}
                <img src={`/api/office/attachments/${p.id}`} alt={p.label} className="aspect-[4/3] w-full rounded object-cover" />
                <span className="flex items-center gap-3 text-lg">
                  <input
                    type="checkbox"
                    checked={on}
                    onChange={() => toggle(p.id)}
                    className="size-8 shrink-0"
                    aria-label={`Share: ${p.label}`}
                  />
                  <span className="font-bold">{on ? "✔ Shared" : "○ Not shared"}</span>
                </span>
                <span className="break-words text-base">{p.label}</span>
              </label>
            );
          })}
        </div>
        {errors.photoIds && <p className="mt-1 text-base font-bold text-fail">✖ {errors.photoIds}</p>}
      </fieldset>
      <FormMessage {...message} />
      <button type="submit" disabled={busy} className={buttonClass}>
        {busy ? "Sharing…" : "Share with the customer"}
      </button>
    </form>
  );
}
