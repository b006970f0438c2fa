"use client";

import { useMutation } from "@tanstack/react-query";
import { useState, type FormEvent } from "react";
import { api, ApiError, fieldErrors } from "@/app/ui/api-client";
import { Field, FormMessage, inputClass, quietButtonClass } from "@/app/ui/form-field";
import { entryAcceptanceSchema } from "@/lib/review/decision-input";
import { issuesOf } from "@/lib/zod-issues";

/**
 * Accepting, in writing, a flagged entry of a closed job that no sign-off can carry (its stage's
 * sign-off withdrawn or never made): otherwise it stays open and the stored build report gets no
 * new revision. The server checks it may be accepted this way (db/review/entry-acceptance.ts).
 * On the office's work order page and the supervisor's review page.
 */
export function EntryAcceptanceForm({
  workOrderId,
  operationId,
  onAccepted,
}: {
  workOrderId: string;
  operationId: string;
  /** What the acceptance did, in words: shown by the page (this form goes with the item it settles), which reads the record again. */
  onAccepted: (message: string) => void;
}) {
  const [error, setError] = useState<string | undefined>();
  const [message, setMessage] = useState<{ error?: string }>({});
  const accept = useMutation({
    mutationFn: (justification: string) =>
      api<{ reportRevision: number | null }>("POST", `/api/jobs/${workOrderId}/flagged-entries/${operationId}/acceptance`, {
        justification,
      }),
    onSuccess: (r) => {
      onAccepted(r.reportRevision ? `Entry accepted. The build report is now revision ${r.reportRevision}.` : "Entry accepted.");
    },
    onError: (e) => {
      if (e instanceof ApiError) setError(fieldErrors(e.issues).justification);
      setMessage({ error: (e as Error).message });
    },
  });
  function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const p = entryAcceptanceSchema.safeParse({ justification: new FormData(e.currentTarget).get("justification") });
    if (!p.success) {
      setError(fieldErrors(issuesOf(p.error)).justification);
      setMessage({ error: "Check the marked field." });
      return;
    }
    setError(undefined);
    accept.mutate(p.data.justification);
  }
  const fieldId = `accept-${operationId}`;
  return (
    <form onSubmit={onSubmit} noValidate className="mt-2 grid w-full gap-2" data-testid="entry-acceptance-form">
      <p className="text-base">
        No sign-off can carry this entry: the job is closed and its stage has no sign-off to decide on. Accept it here if it may stand; the
        report then prints it.
      </p>
      <Field label="Why may it stand?" name={fieldId} error={error}>
        <textarea id={fieldId} name="justification" rows={2} className={`${inputClass} py-2`} aria-invalid={Boolean(error)} />
      </Field>
      <FormMessage error={message.error} />
      <div>
        <button type="submit" className={quietButtonClass} disabled={accept.isPending}>
          Accept this entry
        </button>
      </div>
    </form>
  );
}
