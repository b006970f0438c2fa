"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { api } from "@/app/ui/api-client";
import { buttonClass, inputClass } from "@/app/ui/form-field";

// Cancels a booking with the reason (kept on record); the slot is free again.
export function CancelBooking({ bookingId, label }: { bookingId: string; label: string }) {
  const router = useRouter();
  const [open, setOpen] = useState(false);
  const [error, setError] = useState<string | null>(null);
  if (!open)
    return (
      <button
        type="button"
        className="min-h-12 rounded-lg border-2 border-steel-700 px-4 text-base font-bold"
        onClick={() => setOpen(true)}
        aria-label={`Cancel booking: ${label}`}
      >
        Cancel booking…
      </button>
    );
  return (
    <form
      noValidate
      className="flex flex-wrap items-end gap-2"
      onSubmit={async (e) => {
        e.preventDefault();
        setError(null);
        try {
          await api("POST", `/api/office/bookings/${bookingId}/cancel`, {
            reason: String(new FormData(e.currentTarget).get("reason") ?? ""),
          });
          router.refresh();
        } catch (err) {
          setError((err as Error).message);
        }
      }}
    >
      <label className="flex flex-col text-base font-bold">
        Why cancel?
        <input name="reason" maxLength={500} className={inputClass} />
      </label>
      <button type="submit" className={buttonClass}>
        Cancel it
      </button>
      {error && <p className="w-full font-bold text-fail">✖ {error}</p>}
    </form>
  );
}
