"use client";

import { useQuery, useQueryClient } from "@tanstack/react-query";
import { useState } from "react";
import type { JobHours } from "@/db/bench/clocks";
import { formatHundredthsAsHours, formatMinutes, minutesToHundredths, spanMinutes, type HoursLine } from "@/lib/clock/hours";
import { formatDayTime } from "@/lib/format/dates";
import { api, ApiError, type Wire } from "./api-client";
import { Field, FormMessage, buttonClass, inputClass } from "./form-field";

type Hours = Wire<JobHours>;

const END_WORDS: Record<string, string> = {
  "clocked-off": "clocked off",
  "closed-by-supervisor": "closed by a supervisor",
  "next-clock-on": "ended by the next clock-on",
  running: "running",
};

/** Figures in a column: right-aligned, tabular digits, so they line up. */
const figure = "text-right tabular-nums whitespace-nowrap";

function Lines({ title, lines, name, testId }: { title: string; lines: HoursLine[]; name: (key: string) => string; testId: string }) {
  return (
    <table className="w-full text-lg" data-testid={testId}>
      <caption className="text-left text-xl font-bold">{title}</caption>
      <tbody>
        {lines.map((l) => (
          <tr key={l.key} className="border-t border-steel-300">
            <th scope="row" className="py-1 pr-4 text-left font-normal">
              {name(l.key)}
              {l.running && <span className="ml-2 font-bold text-pass">● running</span>}
            </th>
            <td className={`py-1 ${figure}`}>{formatMinutes(l.minutes)}</td>
            <td className={`py-1 pl-4 ${figure} text-steel-700`}>{formatHundredthsAsHours(minutesToHundredths(l.minutes))}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

/** A supervisor ends a clock left running: when the work stopped, and why. */
export function CloseClock({ jobId, clockId, onDone }: { jobId: string; clockId: string; onDone: () => void }) {
  const [endedAt, setEndedAt] = useState("");
  const [reason, setReason] = useState("");
  const [error, setError] = useState<string | null>(null);
  const [issues, setIssues] = useState<Record<string, string>>({});
  async function submit(e: React.FormEvent) {
    e.preventDefault();
    setError(null);
    setIssues({});
    const at = endedAt ? new Date(endedAt) : null;
    if (!at || !Number.isFinite(at.getTime())) {
      setIssues({ endedAt: "Ended at: give the date and time the work stopped." });
      return;
    }
    try {
      await api("POST", `/api/jobs/${jobId}/clocks/${clockId}/close`, { endedAt: at.toISOString(), reason });
      onDone();
    } catch (err) {
      setError(err instanceof Error ? err.message : String(err));
      if (err instanceof ApiError) setIssues(Object.fromEntries(err.issues.map((i) => [i.path, i.message])));
    }
  }
  return (
    <form onSubmit={submit} className="mt-2 flex flex-wrap items-end gap-4" data-testid="close-clock-form">
      <Field label="Ended at" name="endedAt" error={issues.endedAt}>
        <input id="endedAt" type="datetime-local" className={inputClass} value={endedAt} onChange={(e) => setEndedAt(e.target.value)} />
      </Field>
      <Field label="Reason" name="reason" error={issues.reason}>
        <input id="reason" className={inputClass} value={reason} onChange={(e) => setReason(e.target.value)} maxLength={500} />
      </Field>
      <button type="submit" className={buttonClass}>
        Close this clock
      </button>
      <FormMessage error={error} />
    </form>
  );
}

/** Time at the bench on a job: hours per stage and per person against the quoted labour, and every clock. */
export function HoursPanel({ jobId, canClose = false }: { jobId: string; canClose?: boolean }) {
  const client = useQueryClient();
  const key = ["job-hours", jobId];
  const q = useQuery({ queryKey: key, queryFn: () => api<Hours>("GET", `/api/jobs/${jobId}/hours`) });
  const [closing, setClosing] = useState<string | null>(null);
  const h = q.data;
  const stageName = (k: string) => (k === "" ? "No stage named" : (h?.stageTitles[k] ?? k));
  const personName = (k: string) => h?.people[k] ?? "Someone";
  const clocked = h ? minutesToHundredths(h.totalMinutes) : 0;
  return (
    <section className="rounded-xl border-2 border-steel-300 bg-white p-4" aria-labelledby="hours-heading" data-testid="hours-panel">
      <h2 id="hours-heading" className="text-2xl font-bold">
        Time at the bench
      </h2>
      {q.isLoading && <p className="text-lg">Loading…</p>}
      {q.isError && (
        <p role="alert" className="text-lg font-bold text-fail">
          {(q.error as Error).message}
        </p>
      )}
      {h && (
        <>
          <table className="mt-2 w-full max-w-xl text-lg" data-testid="hours-against-quote">
            <tbody>
              <tr>
                <th scope="row" className="text-left font-normal">
                  Clocked{h.running ? " (a clock is running)" : ""}
                </th>
                <td className={`${figure} font-bold`} data-testid="hours-clocked">
                  {formatHundredthsAsHours(clocked)}
                </td>
              </tr>
              <tr>
                <th scope="row" className="text-left font-normal">
                  Quoted labour{h.quoteVersion !== null ? ` (quote v${h.quoteVersion})` : ""}
                </th>
                <td className={figure} data-testid="hours-quoted">
                  {h.quotedHundredths === null ? "no quote sent" : formatHundredthsAsHours(h.quotedHundredths)}
                </td>
              </tr>
              {h.overQuoteHundredths !== null && (
                <tr className="border-t-2 border-steel-700">
                  <th scope="row" className="text-left">
                    {h.overQuoteHundredths > 0 ? "▲ Over the quote" : "▼ Within the quote, left"}
                  </th>
                  <td
                    className={`${figure} font-bold ${h.overQuoteHundredths > 0 ? "text-fail" : "text-pass"}`}
                    data-testid="hours-difference"
                  >
                    {formatHundredthsAsHours(Math.abs(h.overQuoteHundredths))}
                  </td>
                </tr>
              )}
            </tbody>
          </table>
          {h.spans.length === 0 ? (
            <p className="mt-2 text-lg">Nobody has clocked on this job yet.</p>
          ) : (
            <>
              <div className="mt-4 grid gap-6 md:grid-cols-2">
                <Lines title="Per stage" lines={h.byStage} name={stageName} testId="hours-by-stage" />
                <Lines title="Per person" lines={h.byPerson} name={personName} testId="hours-by-person" />
              </div>
              <details className="mt-4">
                <summary className="min-h-12 cursor-pointer text-lg font-bold">Every clock ({h.spans.length})</summary>
                <ul className="mt-2 flex flex-col gap-2" data-testid="clock-list">
                  {h.spans.map((s) => (
                    <li key={s.id} className="rounded-lg border-2 border-steel-300 p-2 text-base">
                      <span className="font-bold">{s.mechanicName}</span>
                      {s.stageTitle ? ` · ${s.stageTitle}` : ""} · {formatDayTime(s.startedAtMs)} →{" "}
                      {s.running ? "now" : formatDayTime(s.endedAtMs)} ·{" "}
                      <span className="tabular-nums">{formatMinutes(spanMinutes(s))}</span> · {END_WORDS[s.endedBy]}
                      {s.running && canClose && closing !== s.id && (
                        <button type="button" className="ml-3 min-h-12 underline" onClick={() => setClosing(s.id)}>
                          Close this clock with a reason
                        </button>
                      )}
                      {closing === s.id && (
                        <CloseClock
                          jobId={jobId}
                          clockId={s.id}
                          onDone={() => {
                            setClosing(null);
                            void client.invalidateQueries({ queryKey: key });
                          }}
                        />
                      )}
                    </li>
                  ))}
                </ul>
              </details>
              <p className="mt-2 text-sm text-steel-700">
                Each clock counts in whole minutes (nearest minute); hours to two places. A clock runs until its clock-off, a
                supervisor&apos;s close, or the same person&apos;s next clock-on.
              </p>
            </>
          )}
        </>
      )}
    </section>
  );
}
