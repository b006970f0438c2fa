import type { ReactNode } from "react";

// A labelled field with its problem shown beside it (and tied to the input for screen readers).
export function Field({
  label,
  name,
  error,
  hint,
  children,
}: {
  label: string;
  name: string;
  error?: string;
  hint?: string;
  children: ReactNode;
}) {
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={name} className="text-base font-bold">
        {label}
      </label>
      {children}
      {hint && !error && <p className="text-sm text-steel-700">{hint}</p>}
      {error && (
        <p id={`${name}-error`} className="text-base font-bold text-fail" data-testid={`error-${name}`}>
          ✖ {error}
        </p>
      )}
    </div>
  );
}

export const inputClass = "min-h-12 rounded-lg border-2 border-steel-700 bg-white px-3 text-lg aria-[invalid=true]:border-fail";
export const buttonClass = "min-h-12 rounded-lg bg-steel-900 px-5 text-lg font-bold text-white disabled:opacity-60";
export const quietButtonClass =
  "min-h-12 rounded-lg border-2 border-steel-700 bg-white px-4 text-lg font-bold text-ink disabled:opacity-60";

export function FormMessage({ error, ok }: { error?: string | null; ok?: string | null }) {
  if (error)
    return (
      <p
        role="alert"
        data-testid="form-error"
        className="rounded-lg border-2 border-fail bg-fail-light px-4 py-3 text-lg font-bold text-fail"
      >
        {error}
      </p>
    );
  if (ok)
    return (
      <p
        role="status"
        data-testid="form-ok"
        className="rounded-lg border-2 border-pass bg-pass-light px-4 py-3 text-lg font-bold text-pass"
      >
        ✔ {ok}
      </p>
    );
  return null;
}
