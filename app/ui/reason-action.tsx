"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { api } from "./api-client";
import { buttonClass, inputClass } from "./form-field";

// An action that needs a reason on record (cancel a booking, let go of stock put aside): a button
// opens a one-field form; the reason is posted as `{ reason }` to `url` and the page refreshed. A
// refusal shows its message under the form.
export function ReasonAction({
  url,
  openText,
  openLabel,
  question,
  submitText,
}: {
  url: string;
  /** The button that opens the form ("Cancel booking…"). */
  openText: string;
  /** Its accessible name, naming what it acts on. */
  openLabel: string;
  /** The reason field's label ("Why cancel?"). */
  question: string;
  submitText: string;
}) {
  const router = useRouter();
  const [open, setOpen] = useState(false);
  const [error, setError] = useState<string | null>(null);
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
    <form
      noValidate
      className="flex flex-wrap items-end gap-2"
      onSubmit={async (e) => {
        e.preventDefault();
        setError(null);
        try {
          await api("POST", url, { reason: String(new FormData(e.currentTarget).get("reason") ?? "") });
          router.refresh();
        } catch (err) {
          setError((err as Error).message);
        }
      }}
    >
      <label className="flex flex-col text-base font-bold">
        {question}
        <input name="reason" maxLength={500} className={inputClass} />
      </label>
      <button type="submit" className={buttonClass}>
        {submitText}
      </button>
      {error && <p className="w-full font-bold text-fail">✖ {error}</p>}
    </form>
  );
}
