"use client";

import { useState } from "react";
import { api } from "@/app/ui/api-client";
import { buttonClass, inputClass, quietButtonClass } from "@/app/ui/form-field";
import { ReasonAction } from "@/app/ui/reason-action";
import { Outcome, useSubmit } from "@/app/ui/use-submit";

// Puts some of one lot aside for a job (by its number); refused with the reason when that much is not free.
export function ReserveForm({ lotId, label }: { lotId: string; label: string }) {
  const [open, setOpen] = useState(false);
  const s = useSubmit(async (f) => {
    await api("POST", "/api/office/stock/reservations", {
      lotId,
      workOrderNumber: Number(String(f.get("job") ?? "").replace(/^#/, "")),
      quantity: Number(f.get("quantity")),
    });
    setOpen(false);
    return "";
  });
  if (!open)
    return (
      <button
        type="button"
        className={`${quietButtonClass} whitespace-nowrap`}
        onClick={() => setOpen(true)}
        aria-label={`Put aside for a job: ${label}`}
      >
        Put aside…
      </button>
    );
  return (
    <form noValidate className="flex flex-wrap items-end gap-2" onSubmit={s.onSubmit}>
      <label className="flex flex-col text-base font-bold">
        Job number
        <input name="job" inputMode="numeric" className={`${inputClass} w-28`} />
      </label>
      <label className="flex flex-col text-base font-bold">
        Quantity
        <input name="quantity" inputMode="numeric" defaultValue="1" className={`${inputClass} w-24`} />
      </label>
      <button type="submit" className={buttonClass}>
        Put aside
      </button>
      <Outcome error={s.error} ok={s.ok} testId="reserve" />
    </form>
  );
}

// Lets go what a reservation still holds, with the reason (kept on record).
export function ReleaseForm({ reservationId, label }: { reservationId: string; label: string }) {
  return (
    <ReasonAction
      url={`/api/office/stock/reservations/${reservationId}/release`}
      openText="Let go…"
      openLabel={`Let go: ${label}`}
      question="Why let it go?"
      submitText="Let it go"
    />
  );
}
