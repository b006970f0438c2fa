"use client";

import { useState } from "react";
import { api } from "./api-client";
import { buttonClass, inputClass } from "./form-field";
import { Outcome, useSubmit } from "./use-submit";

// An action that needs a reason on record (cancel a booking, let go of stock put aside, retire a
// resource): a button opens a one-field form; the reason is posted as `{ reason }` to `url` and the
// page refreshed. A refusal shows each field's message under the form.
export function ReasonAction({
  url,
  openText,
  openLabel,
  question,
  submitText,
  done = "",
  testId = "reason",
}: {
  url: string;
  /** The button that opens the form ("Cancel booking…"). */
  openText: string;
  /** Its accessible name, naming what it acts on. */
  openLabel: string;
  /** The reason field's label ("Why cancel?"). */
  question: string;
  submitText: string;
  /** What to say once done (nothing by default: the refreshed page shows it). */
  done?: string;
  /** Names the outcome's test ids (`<testId>-error`, `<testId>-ok`). */
  testId?: string;
}) {
  const [open, setOpen] = useState(false);
  const s = useSubmit(async (f) => {
    await api("POST", url, { reason: String(f.get("reason") ?? "") });
    return done;
  });
  if (!open)
    return (
      <button
        type="button"
        className="min-h-12 rounded-lg border-2 border-steel-700 px-4 text-base font-bold"
        onClick={() => setOpen(true)}
        aria-label={openLabel}
      >
        {openText}
      </button>
    );
  return (
    <form noValidate className="flex flex-wrap items-end gap-2" onSubmit={s.onSubmit}>
      <label className="flex flex-col text-base font-bold">
        {question}
        <input name="reason" maxLength={500} className={inputClass} />
      </label>
      <button type="submit" disabled={s.busy} className={buttonClass}>
        {submitText}
      </button>
      <Outcome error={s.error} ok={s.ok} testId={testId} />
    </form>
  );
}
