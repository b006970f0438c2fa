"use client";

import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { api } from "@/app/ui/api-client";
import { formatDayTime } from "@/lib/format/dates";
import { buttonClass, Field, FormMessage, inputClass } from "@/app/ui/form-field";
import { useCheckedForm } from "@/app/ui/use-checked-form";
import { runWithdrawalSchema, type StoredDynoRun } from "@/lib/dyno";

/** Withdraw a run recorded by mistake, with a reason (supervisors and the office). */
export function WithdrawRunForm({ workOrderId, runs }: { workOrderId: string; runs: StoredDynoRun[] }) {
  const router = useRouter();
  const { errors, message, busy, submit } = useCheckedForm();
  const [runId, setRunId] = useState(runs[runs.length - 1]?.id ?? "");
  if (runs.length === 0) return null;
  const chosen = runs.find((r) => r.id === runId) ?? runs[runs.length - 1];

  async function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = e.currentTarget;
    const values = { reason: String(new FormData(form).get("reason") ?? "") };
    await submit(runWithdrawalSchema, values, async () => {
      await api("POST", `/api/jobs/${workOrderId}/dyno-runs/${chosen.id}/withdraw`, values);
      form.reset();
      router.refresh();
      return `“${chosen.label}” withdrawn. It stays on record and no longer counts in the plot or the build report.`;
    });
  }

  return (
    <details className="rounded-xl border-2 border-steel-300 bg-white p-4" data-testid="withdraw-run">
      <summary className="min-h-12 cursor-pointer content-center text-xl font-bold">Withdraw a run recorded by mistake</summary>
      <form onSubmit={onSubmit} noValidate className="mt-3 grid gap-4 md:grid-cols-[1fr_2fr]">
        <Field label="Run" name="withdraw-run">
          <select id="withdraw-run" value={chosen.id} onChange={(e) => setRunId(e.target.value)} className={inputClass}>
            {runs.map((r) => (
              <option key={r.id} value={r.id}>
                {r.label} ({r.ranOn})
              </option>
            ))}
          </select>
        </Field>
        <Field
          label="Why it is withdrawn"
          name="reason"
          error={errors.reason}
          hint="For example: wrong weather figures; record the run again with the right ones"
        >
          <input
            id="reason"
            name="reason"
            aria-invalid={Boolean(errors.reason)}
            aria-describedby={errors.reason ? "reason-error" : undefined}
            className={inputClass}
          />
        </Field>
        <div className="md:col-span-2 flex flex-col gap-2">
          <FormMessage {...message} />
          <button type="submit" disabled={busy} className={`${buttonClass} self-start`}>
            {busy ? "Withdrawing…" : "Withdraw this run"}
          </button>
        </div>
      </form>
    </details>
  );
}

/** Runs withdrawn earlier: on record with who, when and why; counted nowhere. */
export function WithdrawnRuns({ runs }: { runs: StoredDynoRun[] }) {
  if (runs.length === 0) return null;
  return (
    <section aria-labelledby="withdrawn-heading" className="rounded-xl border-2 border-steel-300 bg-white p-4">
      <h2 id="withdrawn-heading" className="text-2xl font-bold">
        Withdrawn runs ({runs.length})
      </h2>
      <ul className="mt-2 space-y-2">
        {runs.map((r) => (
          <li key={r.id} className="border-l-4 border-steel-700 pl-3 text-lg" data-testid="withdrawn-run">
            <span className="font-bold line-through">{r.label}</span> <span className="font-mono">({r.ranOn})</span>
            <span className="block">
              ⊘ withdrawn {r.withdrawn ? `${formatDayTime(r.withdrawn.at)} by ${r.withdrawn.byName ?? "—"}: “${r.withdrawn.reason}”` : ""}
            </span>
          </li>
        ))}
      </ul>
    </section>
  );
}
