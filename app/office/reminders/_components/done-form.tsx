"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { api } from "@/app/ui/api-client";
import { buttonClass, inputClass } from "@/app/ui/form-field";

// Records that a reminder's check or service was done, with an optional note and odometer reading.
export function ReminderDoneForm({ reminderId, label }: { reminderId: string; label: string }) {
  const router = useRouter();
  const [open, setOpen] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  if (!open)
    return (
      <button type="button" className={`${buttonClass} min-h-16`} onClick={() => setOpen(true)} aria-label={`Record done: ${label}`}>
        Record done
      </button>
    );
  return (
    <form
      noValidate
      className="grid gap-2"
      data-testid="done-form"
      onSubmit={async (e) => {
        e.preventDefault();
        const f = new FormData(e.currentTarget);
        const km = String(f.get("odometerKm") ?? "").trim();
        setBusy(true);
        setError(null);
        try {
          await api("POST", `/api/office/reminders/${reminderId}/done`, {
            note: String(f.get("note") ?? ""),
            odometerKm: km === "" ? null : Number(km),
          });
          router.refresh();
        } catch (err) {
          setError((err as Error).message);
        } finally {
          setBusy(false);
        }
      }}
    >
      <label className="text-base font-bold" htmlFor={`note-${reminderId}`}>
        Note (optional)
      </label>
      <input id={`note-${reminderId}`} name="note" maxLength={1000} className={inputClass} />
      <label className="text-base font-bold" htmlFor={`km-${reminderId}`}>
        Odometer (km, optional)
      </label>
      <input id={`km-${reminderId}`} name="odometerKm" inputMode="numeric" className={inputClass} />
      {error && <p className="font-bold text-fail">✖ {error}</p>}
      <button type="submit" disabled={busy} className={`${buttonClass} min-h-16`}>
        {busy ? "Recording…" : "Done — record it"}
      </button>
    </form>
  );
}
