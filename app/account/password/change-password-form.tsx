"use client";

import { useState, type FormEvent } from "react";
import { api } from "@/app/ui/api-client";
import { buttonClass, Field, FormMessage, inputClass } from "@/app/ui/form-field";
import { useCheckedForm } from "@/app/ui/use-checked-form";
import { changePasswordSchema } from "@/lib/auth/password-change-schema";

// Checked here with the server's schema, then sent; the server checks the current password.
export function ChangePasswordForm() {
  const { errors, message, busy, submit } = useCheckedForm();
  const [formKey, setFormKey] = useState(0);

  async function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const entries = Object.fromEntries(new FormData(e.currentTarget));
    await submit(changePasswordSchema, { current: entries.current, password: entries.password, repeat: entries.repeat }, async (values) => {
      const done = await api<{ otherSessionsEnded: number }>("POST", "/api/me/password", values);
      setFormKey((k) => k + 1);
      const others = done.otherSessionsEnded;
      return `Your password is changed.${others ? ` ${others === 1 ? "One other sign-in was" : `${others} other sign-ins were`} signed out.` : ""}`;
    });
  }

  const field = (name: "current" | "password" | "repeat", label: string, autoComplete: string, hint?: string) => (
    <Field label={label} name={name} error={errors[name]} hint={hint}>
      <input
        id={name}
        name={name}
        type="password"
        autoComplete={autoComplete}
        className={inputClass}
        aria-invalid={Boolean(errors[name])}
      />
    </Field>
  );
  return (
    <form key={formKey} onSubmit={onSubmit} noValidate className="mt-6 grid gap-4" data-testid="change-password-form">
      {field("current", "Current password", "current-password")}
      {field("password", "New password", "new-password", "At least 10 characters.")}
      {field("repeat", "New password again", "new-password")}
      <FormMessage {...message} />
      <button type="submit" disabled={busy} className={buttonClass}>
        {busy ? "Saving…" : "Change my password"}
      </button>
    </form>
  );
}
