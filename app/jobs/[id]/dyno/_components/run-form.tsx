"use client";

import { useRouter } from "next/navigation";
import { useState, type ReactNode } from "react";
import { POWER_CORRECTION_STANDARD_IDS, POWER_CORRECTION_STANDARDS } from "@/lib/calc";
import { BOOST_UNITS, CURVE_TORQUE_UNITS, runProblems, type CurveRowError } from "@/lib/dyno";
import type { ErrorBody } from "@/lib/errors";
import { ToggleGroup } from "./toggle-group";

type Row = { rpm: string; torque: string };
const blankRows = (n: number): Row[] => Array.from({ length: n }, () => ({ rpm: "", torque: "" }));
const today = () => new Date().toISOString().slice(0, 10);

const input = "min-h-14 w-full rounded-lg border-2 border-steel-700 bg-white px-3 text-lg";

function Field({ id, label, error, children }: { id: string; label: string; error?: string; children: ReactNode }) {
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-base font-bold">
        {label}
      </label>
      {children}
      {error && (
        <p id={`${id}-error`} className="rounded bg-fail-light px-2 py-1 text-base font-bold text-fail" data-testid={`error-${id}`}>
          ✕ {error}
        </p>
      )}
    </div>
  );
}

// Records a new run: its facts, and the curve typed into a table or taken from a CSV file.
export function RunForm({ workOrderId }: { workOrderId: string }) {
  const router = useRouter();
  const [source, setSource] = useState<"table" | "csv">("csv");
  const [rows, setRows] = useState<Row[]>(blankRows(6));
  const [fileText, setFileText] = useState<string | null>(null);
  const [fileName, setFileName] = useState("");
  const [fieldErrors, setFieldErrors] = useState<Record<string, string>>({});
  const [curveErrors, setCurveErrors] = useState<CurveRowError[]>([]);
  const [message, setMessage] = useState<{ ok: boolean; text: string } | null>(null);
  const [busy, setBusy] = useState(false);

  async function submit(form: HTMLFormElement) {
    setBusy(true);
    setMessage(null);
    const data = new FormData(form);
    const get = (k: string) => String(data.get(k) ?? "");
    const body = {
      label: get("label"),
      ranOn: get("ranOn"),
      boostTarget: get("boostTarget"),
      boostUnit: get("boostUnit"),
      pressureKpa: get("pressureKpa"),
      temperatureC: get("temperatureC"),
      humidityPercent: get("humidityPercent"),
      standard: get("standard"),
      notes: get("notes"),
      curve:
        source === "csv" ? { source: "csv", fileName, text: fileText ?? "" } : { source: "table", torqueUnit: get("torqueUnit"), rows },
    };
    try {
      const res = await fetch(`/api/jobs/${workOrderId}/dyno-runs`, {
        method: "POST",
        headers: { "content-type": "application/json" },
        body: JSON.stringify(body),
      });
      const json = (await res.json().catch(() => ({}))) as Partial<ErrorBody>;
      if (res.ok) {
        setFieldErrors({});
        setCurveErrors([]);
        form.reset();
        setRows(blankRows(6));
        setFileText(null);
        setFileName("");
        setMessage({ ok: true, text: `Run “${body.label}” saved.` });
        router.refresh();
      } else {
        const problems = runProblems(json.issues ?? []);
        setFieldErrors(problems.fieldErrors);
        setCurveErrors(problems.curveErrors);
        if (source === "csv" && !fileText) setCurveErrors([{ row: 1, column: "(file)", message: "Choose a CSV file first" }]);
        setMessage({ ok: false, text: `${json.error ?? "The run was not saved."} Nothing was saved.` });
      }
    } catch {
      setMessage({ ok: false, text: "No connection to the server: the run was not saved. Try again." });
    } finally {
      setBusy(false);
    }
  }

  const rowError = (i: number, col: "rpm" | "torque") =>
    curveErrors.find((e) => e.row === i + 1 && (col === "rpm" ? e.column.startsWith("Engine") : e.column.startsWith("Torque")));

  return (
    <section aria-labelledby="new-run-heading" className="rounded-xl border-2 border-steel-700 bg-white p-5">
      <h2 id="new-run-heading" className="text-2xl font-bold">
        Record a run
      </h2>
      <form
        noValidate
        className="mt-4 flex flex-col gap-5"
        onSubmit={(e) => {
          e.preventDefault();
          void submit(e.currentTarget);
        }}
      >
        <div className="grid gap-4 md:grid-cols-3">
          <Field id="label" label="Run name" error={fieldErrors.label}>
            <input id="label" name="label" className={input} placeholder="e.g. 10 psi, baffle out" aria-invalid={!!fieldErrors.label} />
          </Field>
          <Field id="ranOn" label="Date" error={fieldErrors.ranOn}>
            <input id="ranOn" name="ranOn" type="date" defaultValue={today()} className={input} />
          </Field>
          <Field id="boostTarget" label="Boost target" error={fieldErrors.boostTarget ?? fieldErrors.boostUnit}>
            <div className="flex gap-2">
              <input id="boostTarget" name="boostTarget" inputMode="decimal" className={input} />
              <select name="boostUnit" aria-label="Boost unit" defaultValue="psi" className={`${input} w-28`}>
                {BOOST_UNITS.map((u) => (
                  <option key={u}>{u}</option>
                ))}
              </select>
            </div>
          </Field>
          <Field id="pressureKpa" label="Air pressure (kPa)" error={fieldErrors.pressureKpa}>
            <input id="pressureKpa" name="pressureKpa" inputMode="decimal" className={input} />
          </Field>
          <Field id="temperatureC" label="Air temperature (°C)" error={fieldErrors.temperatureC}>
            <input id="temperatureC" name="temperatureC" inputMode="decimal" className={input} />
          </Field>
          <Field id="humidityPercent" label="Humidity (%)" error={fieldErrors.humidityPercent}>
            <input id="humidityPercent" name="humidityPercent" inputMode="decimal" className={input} />
          </Field>
          <Field id="standard" label="Correct to" error={fieldErrors.standard}>
            <select id="standard" name="standard" defaultValue="SAE_J1349" className={input}>
              {POWER_CORRECTION_STANDARD_IDS.map((s) => (
                <option key={s} value={s}>
                  {POWER_CORRECTION_STANDARDS[s].label}
                </option>
              ))}
            </select>
          </Field>
          <div className="md:col-span-2">
            <Field id="notes" label="Notes (baffle, fuel, changes since the last run…)" error={fieldErrors.notes}>
              <textarea id="notes" name="notes" rows={2} className={`${input} py-2`} />
            </Field>
          </div>
        </div>

        <fieldset className="flex flex-col gap-3">
          <legend className="text-lg font-bold">Curve</legend>
          <ToggleGroup
            label="Curve points"
            options={[
              { value: "csv", label: "From a CSV file" },
              { value: "table", label: "Typed in" },
            ]}
            value={source}
            onChange={setSource}
          />
          {source === "csv" ? (
            <div className="flex flex-col gap-2">
              <label htmlFor="curve-file" className="text-base">
                Columns: <code className="font-mono">rpm</code> and <code className="font-mono">torque_nm</code> or{" "}
                <code className="font-mono">torque_lbft</code>, one line per point, rpm rising.
              </label>
              <input
                id="curve-file"
                type="file"
                accept=".csv,text/csv"
                className="min-h-target text-lg file:mr-4 file:min-h-target file:rounded-lg file:border-2 file:border-ink file:bg-white file:px-4 file:text-lg file:font-bold"
                onChange={async (e) => {
                  const f = e.currentTarget.files?.[0];
                  setFileName(f?.name ?? "");
                  setFileText(f ? await f.text() : null);
                }}
              />
            </div>
          ) : (
            <div className="flex flex-col gap-2">
              <label className="flex items-center gap-3 text-base font-bold">
                Torque unit
                <select name="torqueUnit" defaultValue="N·m" className={`${input} w-32`}>
                  {CURVE_TORQUE_UNITS.map((u) => (
                    <option key={u}>{u}</option>
                  ))}
                </select>
              </label>
              <table className="w-full max-w-xl text-lg">
                <thead>
                  <tr>
                    <th className="w-12 text-left">Row</th>
                    <th className="text-left">Engine speed (rpm)</th>
                    <th className="text-left">Torque</th>
                  </tr>
                </thead>
                <tbody>
                  {rows.map((r, i) => (
                    <tr key={i}>
                      <td className="font-mono">{i + 1}</td>
                      {(["rpm", "torque"] as const).map((col) => (
                        <td key={col} className="p-1">
                          <input
                            aria-label={`Row ${i + 1} ${col === "rpm" ? "engine speed" : "torque"}`}
                            inputMode="decimal"
                            value={r[col]}
                            aria-invalid={!!rowError(i, col)}
                            onChange={(e) => {
                              const v = e.currentTarget.value;
                              setRows((rs) => rs.map((x, j) => (j === i ? { ...x, [col]: v } : x)));
                            }}
                            className={`${input} ${rowError(i, col) ? "border-fail bg-fail-light" : ""}`}
                          />
                        </td>
                      ))}
                    </tr>
                  ))}
                </tbody>
              </table>
              <button
                type="button"
                onClick={() => setRows((rs) => [...rs, ...blankRows(4)])}
                className="min-h-target self-start rounded-lg border-2 border-ink bg-white px-4 text-lg font-bold"
              >
                Add 4 rows
              </button>
            </div>
          )}
          {curveErrors.length > 0 && (
            <div role="alert" className="rounded-lg border-2 border-fail bg-fail-light p-3" data-testid="curve-errors">
              <p className="font-bold text-fail">
                ✕ The curve has {curveErrors.length} problem{curveErrors.length === 1 ? "" : "s"}:
              </p>
              <ul className="mt-1 list-disc pl-6 text-lg">
                {curveErrors.slice(0, 30).map((e, i) => (
                  <li key={i}>
                    {source === "csv" ? "Line" : "Row"} {e.row}, {e.column}: {e.message}
                  </li>
                ))}
              </ul>
            </div>
          )}
        </fieldset>

        <div className="flex flex-wrap items-center gap-4">
          <button
            type="submit"
            disabled={busy}
            className="min-h-target rounded-xl bg-signal px-8 text-xl font-bold text-ink disabled:opacity-60"
          >
            {busy ? "Saving…" : "Save run"}
          </button>
          {message && (
            <p
              role="status"
              data-testid="form-message"
              className={`rounded px-3 py-2 text-lg font-bold ${message.ok ? "bg-pass-light text-pass" : "bg-fail-light text-fail"}`}
            >
              {message.ok ? "✓ " : "✕ "}
              {message.text}
            </p>
          )}
        </div>
      </form>
    </section>
  );
}
