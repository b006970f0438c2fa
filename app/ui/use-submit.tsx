"use client";

import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { ApiError } from "./api-client";

// A small office form's submit: the form's data goes to `send`, the page is refreshed on success,
// and a refusal is shown in workshop words. These forms mark no fields, so a refusal's message is
// each field's own ("Reason: say why, at least 3 characters") rather than "Check the marked fields".

/** The refusal in words: each field's message when the server named fields, else its message. */
function refusalText(err: unknown): string {
  const each = err instanceof ApiError ? err.issues.map((i) => i.message) : [];
  return each.length ? each.join(" ") : err instanceof Error ? err.message : String(err);
}

/** `send` posts the form and returns what to say on success ("" for nothing). */
export function useSubmit(send: (f: FormData) => Promise<string>) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [ok, setOk] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const onSubmit = async (e: FormEvent<HTMLFormElement>) => {
    e.preventDefault();
    const form = e.currentTarget;
    setBusy(true);
    setError(null);
    setOk(null);
    try {
      setOk(await send(new FormData(form)));
      router.refresh();
    } catch (err) {
      setError(refusalText(err));
    } finally {
      setBusy(false);
    }
  };
  return { error, ok, busy, onSubmit };
}

/** What came of the submit: the refusal (✖) or what was done (✔). */
export function Outcome({ error, ok, testId }: { error: string | null; ok: string | null; testId: string }) {
  if (error)
    return (
      <p role="alert" data-testid={`${testId}-error`} className="w-full font-bold text-fail md:col-span-2">
        ✖ {error}
      </p>
    );
  if (ok)
    return (
      <p role="status" data-testid={`${testId}-ok`} className="w-full font-bold text-pass md:col-span-2">
        ✔ {ok}
      </p>
    );
  return null;
}
