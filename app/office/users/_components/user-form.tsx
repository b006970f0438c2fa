"use client";

import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { api } from "@/app/ui/api-client";
import { buttonClass, Field, FormMessage, inputClass } from "@/app/ui/form-field";
import { useCheckedForm } from "@/app/ui/use-checked-form";
import { newUserSchema } from "@/lib/office/user-schema";

const ROLE_LABELS = { mechanic: "Mechanic", supervisor: "Supervisor", office: "Office", customer: "Customer" } as const;

// Give someone a sign-in. Checked with the same zod schema as the server, problems shown inline.
export function UserForm({ customers }: { customers: Array<{ id: string; name: string }> }) {
  const router = useRouter();
  const { errors, message, busy, submit } = useCheckedForm();
  const [role, setRole] = useState("mechanic");

  async function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = e.currentTarget;
    const entries = Object.fromEntries(new FormData(form));
    const values = { ...entries, customerId: entries.customerId ?? null };
    await submit(newUserSchema, values, async (user) => {
      await api("POST", "/api/office/users", values);
      form.reset();
      router.refresh();
      return user.role === "customer" && !user.password
        ? `Sign-in made for ${user.email}; the invitation e-mail is on its way.`
        : `Sign-in made for ${user.email}.`;
    });
  }

  const f = (name: string) => ({
    id: name,
    name,
    "aria-invalid": Boolean(errors[name]),
    "aria-describedby": errors[name] ? `${name}-error` : undefined,
  });
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
        <Field
          label="First password"
          name="password"
          error={errors.password}
          hint={
            role === "customer"
              ? "Leave it empty to e-mail them a link to choose their own (it works once, for 72 hours)."
              : "At least 10 characters; tell it to them in person."
          }
        >
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
