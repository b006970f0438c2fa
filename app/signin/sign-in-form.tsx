"use client";

import { signIn } from "next-auth/react";
import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { credentialsSchema } from "@/lib/auth/credentials";

export function SignInForm() {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = new FormData(e.currentTarget);
    const parsed = credentialsSchema.safeParse({ email: form.get("email"), password: form.get("password") });
    if (!parsed.success) {
      setError(parsed.error.issues[0]?.message ?? "Check your e-mail and password");
      return;
    }
    setBusy(true);
    setError(null);
    const res = await signIn("credentials", { ...parsed.data, redirect: false });
    setBusy(false);
    if (!res || res.error) {
      setError(res?.error && res.error !== "CredentialsSignin" ? res.error : "That e-mail and password do not match an active account.");
      return;
    }
    router.replace("/");
    router.refresh();
  }

  return (
    <form onSubmit={onSubmit} noValidate className="mt-8 flex flex-col gap-5">
      <label className="flex flex-col gap-2 text-lg font-bold">
        E-mail
        <input
          name="email"
          type="email"
          autoComplete="username"
          required
          className="min-h-target rounded-lg border-2 border-steel-700 bg-white px-4 text-xl font-normal"
        />
      </label>
      <label className="flex flex-col gap-2 text-lg font-bold">
        Password
        <input
          name="password"
          type="password"
          autoComplete="current-password"
          required
          className="min-h-target rounded-lg border-2 border-steel-700 bg-white px-4 text-xl font-normal"
        />
      </label>
      {error && (
        <p
          role="alert"
          data-testid="form-error"
          className="rounded-lg border-2 border-fail bg-fail-light px-4 py-3 text-lg font-bold text-fail"
        >
          {error}
        </p>
      )}
      <button
        type="submit"
        disabled={busy}
        className="min-h-target rounded-lg bg-steel-900 px-6 text-xl font-bold text-white disabled:opacity-60"
      >
        {busy ? "Signing in…" : "Sign in"}
      </button>
    </form>
  );
}
