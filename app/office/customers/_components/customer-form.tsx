"use client";

import { useRouter } from "next/navigation";
import type { FormEvent } from "react";
import { customerSchema } from "@/lib/office/schemas";
import { api } from "@/app/ui/api-client";
import { useCheckedForm } from "@/app/ui/use-checked-form";
import { buttonClass, Field, FormMessage, inputClass } from "@/app/ui/form-field";

type Values = { name: string; email: string; phone: string; notes: string };

// Add or edit a customer. Checked with the same zod schema as the server, problems shown inline.
export function CustomerForm({ customerId, initial }: { customerId?: string; initial?: Values }) {
  const router = useRouter();
  const { errors, message, busy, submit } = useCheckedForm();

  async function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const values = Object.fromEntries(new FormData(e.currentTarget)) as Values;
    await submit(customerSchema, values, async () => {
      if (customerId) {
        await api("PUT", `/api/office/customers/${customerId}`, values);
        router.refresh();
        return "Saved.";
      }
      const r = await api<{ id: string }>("POST", "/api/office/customers", values);
      router.push(`/office/customers/${r.id}`);
    });
  }

  const f = (name: keyof Values) => ({
    id: name,
    name,
    defaultValue: initial?.[name] ?? "",
    "aria-invalid": Boolean(errors[name]),
    "aria-describedby": errors[name] ? `${name}-error` : undefined,
  });
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
