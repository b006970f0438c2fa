"use client";

import { useRouter } from "next/navigation";
import type { FormEvent } from "react";
import { api } from "@/app/ui/api-client";
import { buttonClass, Field, FormMessage, inputClass } from "@/app/ui/form-field";
import { useCheckedForm } from "@/app/ui/use-checked-form";
import { messageSchema } from "@/lib/customer-contact/schemas";

// Writes one message on a job's thread (the customer's question or the office's answer).
export function MessageForm({ url, label, button, testId }: { url: string; label: string; button: string; testId: string }) {
  const router = useRouter();
  const { errors, message, busy, submit } = useCheckedForm();

  async function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = e.currentTarget;
    const values = { body: String(new FormData(form).get("body") ?? "") };
    await submit(messageSchema, values, async (v) => {
      const r = await api<{ warning?: string }>("POST", url, v);
      form.reset();
      router.refresh();
      return r.warning ? `Sent. ${r.warning}` : "Sent.";
    });
  }
  const id = `${testId}-body`;
  return (
    <form onSubmit={onSubmit} noValidate className="mt-3 grid gap-3" data-testid={testId}>
      <Field label={label} name={id} error={errors.body}>
        <textarea id={id} name="body" rows={3} className={`${inputClass} py-2`} aria-invalid={Boolean(errors.body)} />
      </Field>
      <FormMessage {...message} />
      <button type="submit" disabled={busy} className={buttonClass}>
        {busy ? "Sending…" : button}
      </button>
    </form>
  );
}
