"use client";

import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { api, ApiError, fieldErrors } from "@/app/ui/api-client";
import { buttonClass, Field, FormMessage, inputClass } from "@/app/ui/form-field";
import { issuesOf } from "@/lib/office/schemas";
import { newUserSchema } from "@/lib/office/user-schema";

const ROLE_LABELS = { mechanic: "Mechanic", supervisor: "Supervisor", office: "Office", customer: "Customer" } as const;

// Give someone a sign-in. Checked with the same zod schema as the server, problems shown inline.
export function UserForm({ customers }: { customers: Array<{ id: string; name: string }> }) {
  const router = useRouter();
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [message, setMessage] = useState<{ error?: string; ok?: string }>({});
  const [role, setRole] = useState("mechanic");
  const [busy, setBusy] = useState(false);

  async function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = e.currentTarget;
    const values = Object.fromEntries(new FormData(form));
    const parsed = newUserSchema.safeParse({ ...values, customerId: values.customerId ?? null });
    if (!parsed.success) {
      setErrors(fieldErrors(issuesOf(parsed.error)));
      setMessage({ error: "Check the marked fields." });
      return;
    }
    setErrors({});
    setBusy(true);
    try {
      await api("POST", "/api/office/users", { ...values, customerId: values.customerId ?? null });
      setMessage({ ok: `Sign-in made for ${parsed.data.email}.` });
      form.reset();
      router.refresh();
    } catch (err) {
      if (err instanceof ApiError) setErrors(fieldErrors(err.issues));
      setMessage({ error: (err as Error).message });
    } finally {
      setBusy(false);
    }
  }

  const f = (name: string) => ({ id: name, name, "aria-invalid": Boolean(errors[name]), "aria-describedby": errors[name] ? `${name}-error` : undefined });
  return (
    <form onSubmit={onSubmit} noValidate className="grid max-w-2xl gap-4" data-testid="user-form">
      <div className="grid gap-4 md:grid-cols-2">
        <Field label="Name" name="name" error={errors.name}>
          <input {...f("name")} className={inputClass} autoComplete="off" />
        </Field>
        <Field label="E-mail" name="email" error={errors.email}>
          <input {...f("email")} type="email" className={inputClass} autoComplete="off" />
        </Field>
        <Field label="Role" name="role" error={errors.role}>
          <select {...f("role")} value={role} onChange={(e) => setRole(e.target.value)} className={inputClass}>
            {Object.entries(ROLE_LABELS).map(([value, label]) => (
              <option key={value} value={value}>
                {label}
              </option>
            ))}
          </select>
        </Field>
        {role === "customer" && (
          <Field label="Customer" name="customerId" error={errors.customerId}>
            <select {...f("customerId")} className={inputClass} defaultValue="">
              <option value="">Choose…</option>
              {customers.map((c) => (
                <option key={c.id} value={c.id}>
                  {c.name}
                </option>
              ))}
            </select>
          </Field>
        )}
        <Field label="First password" name="password" error={errors.password} hint="At least 10 characters; tell it to them in person.">
          <input {...f("password")} type="password" className={inputClass} autoComplete="new-password" />
        </Field>
      </div>
      <FormMessage {...message} />
      <button type="submit" disabled={busy} className={buttonClass}>
        {busy ? "Saving…" : "Make the sign-in"}
      </button>
    </form>
  );
}
