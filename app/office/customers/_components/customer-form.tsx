"use client";

import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { customerSchema, issuesOf } from "@/lib/office/schemas";
import { api, ApiError, fieldErrors } from "@/app/ui/api-client";
import { buttonClass, Field, FormMessage, inputClass } from "@/app/ui/form-field";

type Values = { name: string; email: string; phone: string; notes: string };

// Add or edit a customer. Checked with the same zod schema as the server, problems shown inline.
export function CustomerForm({ customerId, initial }: { customerId?: string; initial?: Values }) {
  const router = useRouter();
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [message, setMessage] = useState<{ error?: string; ok?: string }>({});
  const [busy, setBusy] = useState(false);

  async function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = e.currentTarget;
    const values = Object.fromEntries(new FormData(form)) as Values;
    const parsed = customerSchema.safeParse(values);
    if (!parsed.success) {
      setErrors(fieldErrors(issuesOf(parsed.error)));
      setMessage({ error: "Check the marked fields." });
      return;
    }
    setErrors({});
    setBusy(true);
    try {
      if (customerId) {
        await api("PUT", `/api/office/customers/${customerId}`, values);
        setMessage({ ok: "Saved." });
        router.refresh();
      } else {
        const r = await api<{ id: string }>("POST", "/api/office/customers", values);
        router.push(`/office/customers/${r.id}`);
      }
    } catch (err) {
      if (err instanceof ApiError) setErrors(fieldErrors(err.issues));
      setMessage({ error: (err as Error).message });
    } finally {
      setBusy(false);
    }
  }

  const f = (name: keyof Values) => ({ id: name, name, defaultValue: initial?.[name] ?? "", "aria-invalid": Boolean(errors[name]), "aria-describedby": errors[name] ? `${name}-error` : undefined });
  return (
    <form onSubmit={onSubmit} noValidate className="grid max-w-2xl gap-4" data-testid="customer-form">
      <Field label="Name" name="name" error={errors.name}>
        <input {...f("name")} className={inputClass} autoComplete="off" />
      </Field>
      <div className="grid gap-4 md:grid-cols-2">
        <Field label="E-mail" name="email" error={errors.email}>
          <input {...f("email")} type="email" className={inputClass} autoComplete="off" />
        </Field>
        <Field label="Phone" name="phone" error={errors.phone}>
          <input {...f("phone")} type="tel" className={inputClass} autoComplete="off" />
        </Field>
      </div>
      <Field label="Notes" name="notes" error={errors.notes}>
        <textarea {...f("notes")} rows={2} className={`${inputClass} py-2`} />
      </Field>
      <FormMessage error={message.error} ok={message.ok} />
      <div>
        <button type="submit" disabled={busy} className={buttonClass}>
          {customerId ? "Save customer" : "Add customer"}
        </button>
      </div>
    </form>
  );
}
