"use client";

import { useState, type FormEvent } from "react";
import { api } from "@/app/ui/api-client";
import { buttonClass, Field, FormMessage, inputClass } from "@/app/ui/form-field";
import { useCheckedForm } from "@/app/ui/use-checked-form";
import { setPasswordSchema } from "@/lib/customer-contact/schemas";

// Choose a password with an invitation link; checked here with the server's schema, then sent.
export function SetPasswordForm({ token }: { token: string }) {
  const { errors, message, busy, submit } = useCheckedForm();
  const [done, setDone] = useState(false);

  async function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const entries = Object.fromEntries(new FormData(e.currentTarget));
    await submit(setPasswordSchema, { token, password: entries.password, repeat: entries.repeat }, async (values) => {
      await api("POST", "/api/welcome", values);
      setDone(true);
      return "Your password is set.";
    });
  }

  if (done)
    return (
      <div className="mt-6 grid gap-4" data-testid="password-set">
        <FormMessage ok="Your password is set. This link cannot be used again." />
        <a href="/signin" className={`${buttonClass} flex items-center justify-center`}>
          Sign in
        </a>
      </div>
    );
  return (
    <form onSubmit={onSubmit} noValidate className="mt-6 grid gap-4" data-testid="set-password-form">
      <Field label="Password" name="password" error={errors.password} hint="At least 10 characters.">
        <input
          id="password"
          name="password"
          type="password"
          autoComplete="new-password"
          className={inputClass}
          aria-invalid={Boolean(errors.password)}
        />
      </Field>
      <Field label="Password again" name="repeat" error={errors.repeat}>
        <input
          id="repeat"
          name="repeat"
          type="password"
          autoComplete="new-password"
          className={inputClass}
          aria-invalid={Boolean(errors.repeat)}
        />
      </Field>
      <FormMessage {...message} />
      <button type="submit" disabled={busy} className={buttonClass}>
        {busy ? "Saving…" : "Set my password"}
      </button>
    </form>
  );
}
