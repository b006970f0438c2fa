"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { api, ApiError } from "@/app/ui/api-client";
import { Field, inputClass, quietButtonClass } from "@/app/ui/form-field";

// Settling a hand-over's entries on one job: the office writes what was re-entered on the record
// (or why nothing needs to be); the job's open item closes. A refusal is shown beside the note.
export function SettleHandover({ handoverId, workOrderId, number }: { handoverId: string; workOrderId: string; number: number }) {
  const router = useRouter();
  const [open, setOpen] = useState(false);
  const [note, setNote] = useState("");
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const name = `settle-${handoverId}-${workOrderId}`;
  if (!open)
    return (
      <button
        type="button"
        className={quietButtonClass}
        onClick={() => setOpen(true)}
        aria-label={`Settle the hand-over on job #${number}`}
      >
        Settle…
      </button>
    );
  return (
    <form
      className="mt-2 flex max-w-xl flex-col gap-2"
      onSubmit={async (e) => {
        e.preventDefault();
        setError(null);
        setBusy(true);
        try {
          await api("POST", `/api/office/outbox-handovers/${handoverId}/settlements`, { workOrderId, note });
          router.refresh();
        } catch (err) {
          setError(err instanceof ApiError && err.issues.length ? err.issues.map((i) => i.message).join(" ") : (err as Error).message);
        } finally {
          setBusy(false);
        }
      }}
    >
      <Field
        label={`What was done with this work on job #${number}?`}
        name={name}
        error={error ?? undefined}
        hint="Kept with the job's record for good."
      >
        <textarea
          id={name}
          className={`${inputClass} py-2`}
          rows={3}
          value={note}
          aria-invalid={Boolean(error)}
          aria-describedby={error ? `${name}-error` : undefined}
          onChange={(e) => setNote(e.target.value)}
        />
      </Field>
      <button type="submit" className={quietButtonClass} disabled={busy}>
        Settle it
      </button>
    </form>
  );
}
