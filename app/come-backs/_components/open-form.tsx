"use client";

import { useRouter } from "next/navigation";
import { api } from "@/app/ui/api-client";
import { buttonClass, Field, FormMessage, inputClass } from "@/app/ui/form-field";
import { useCheckedForm } from "@/app/ui/use-checked-form";
import { openComeBackSchema } from "@/lib/aftercare/come-backs";

// Opens a come-back for a handed-over job: what the rider reports, the odometer, warranty claimed.
export function OpenComeBackForm({ originalWorkOrderId, originalNumber }: { originalWorkOrderId: string; originalNumber: number }) {
  const router = useRouter();
  const { errors: fields, message, busy, submit } = useCheckedForm();
  async function onSubmit(e: React.FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const f = new FormData(e.currentTarget);
    const km = String(f.get("odometerKm") ?? "").trim();
    const values = {
      originalWorkOrderId,
      riderReport: String(f.get("riderReport") ?? ""),
      odometerKm: km === "" ? null : Number(km),
      warrantyClaimed: f.get("warrantyClaimed") === "yes",
    };
    await submit(openComeBackSchema, values, async (data) => {
      const r = await api<{ id: string }>("POST", "/api/come-backs", data);
      router.push(`/come-backs/${r.id}`);
    });
  }
  return (
    <form onSubmit={onSubmit} noValidate className="grid max-w-2xl gap-4" data-testid="open-come-back">
      <Field label="What the rider reports" name="riderReport" error={fields.riderReport}>
        <textarea id="riderReport" name="riderReport" rows={4} maxLength={2000} className={`${inputClass} py-2`} />
      </Field>
      <Field label="Odometer now (km)" name="odometerKm" error={fields.odometerKm}>
        <input id="odometerKm" name="odometerKm" inputMode="numeric" className={inputClass} />
      </Field>
      <fieldset className="flex flex-wrap gap-4">
        <legend className="mb-1 text-base font-bold">Does the rider claim warranty?</legend>
        <label className="flex min-h-16 items-center gap-3 rounded-lg border-2 border-steel-700 px-4 text-lg">
          <input type="radio" name="warrantyClaimed" value="yes" className="h-6 w-6" /> Yes, claims warranty
        </label>
        <label className="flex min-h-16 items-center gap-3 rounded-lg border-2 border-steel-700 px-4 text-lg">
          <input type="radio" name="warrantyClaimed" value="no" defaultChecked className="h-6 w-6" /> No claim
        </label>
      </fieldset>
      <FormMessage error={message.error} />
      <button type="submit" disabled={busy} className={`${buttonClass} min-h-16`}>
        {busy ? "Opening…" : `Open a come-back of job #${originalNumber}`}
      </button>
    </form>
  );
}
