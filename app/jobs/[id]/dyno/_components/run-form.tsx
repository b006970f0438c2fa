"use client";

import { useRouter } from "next/navigation";
import { useState, type ReactNode } from "react";
import {
  BOOSTED_ENGINE_CAUTION,
  CalcInputError,
  correctionValidity,
  FUEL_IDS,
  FUELS,
  POWER_CORRECTION_STANDARD_IDS,
  POWER_CORRECTION_STANDARDS,
  STATION_PRESSURE_NOTE,
  stationPressureKpa,
  validityRangeWords,
  vaporPressureKpa,
} from "@/lib/calc";
import { BOOST_UNITS, boostTargetProblem, CURVE_TORQUE_UNITS, guessMapping, runProblems, type CurveRowError } from "@/lib/dyno";
import type { TuneVersion } from "@/lib/dyno/tune-version";
import type { ErrorBody } from "@/lib/errors";
import { ColumnMappingStep, mappingOf, previewOf, type MappingRow, type SavedMapping } from "./column-mapping-step";
import { ToggleGroup } from "./toggle-group";
import { FormStatus, type FormOutcome } from "./form-status";

export type { SavedMapping } from "./column-mapping-step";

type Row = { rpm: string; torque: string };
type Source = "csv" | "mapped-csv" | "table";
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

const numberOrNull = (text: string) => (text.trim() === "" || !Number.isFinite(Number(text)) ? null : Number(text));

// Works out the station pressure from the altitude and the weather report's sea-level figure.
function StationPressureHelper({ onResult }: { onResult: (kpa: string) => void }) {
  const [altitude, setAltitude] = useState("");
  const [seaLevel, setSeaLevel] = useState("");
  const [unit, setUnit] = useState<"hPa" | "kPa">("hPa");
  const [result, setResult] = useState<{ ok: boolean; text: string } | null>(null);
  const work = () => {
    try {
      const sl = numberOrNull(seaLevel);
      const kpa = stationPressureKpa(sl === null ? Number.NaN : unit === "hPa" ? sl / 10 : sl, numberOrNull(altitude) ?? Number.NaN);
      const text = kpa.toFixed(1);
      onResult(text);
      setResult({ ok: true, text: `Station pressure ${text} kPa entered above (standard atmosphere, ISO 2533).` });
    } catch (e) {
      setResult({ ok: false, text: e instanceof CalcInputError ? e.message : "Check the two figures." });
    }
  };
  return (
    <details className="rounded-lg border-2 border-steel-300 p-3 md:col-span-3" data-testid="station-helper">
      <summary className="flex min-h-target cursor-pointer items-center text-lg font-bold">
        Work out the air pressure from altitude and sea-level pressure
      </summary>
      <p className="text-base">
        A weather report&apos;s pressure is the <strong>sea-level</strong> figure, not the pressure at the dyno: at 1 000 m the two differ
        by about 11 %.
      </p>
      <div className="mt-2 flex flex-wrap items-end gap-4">
        <label className="flex flex-col gap-1 text-base font-bold">
          Altitude of the dyno (m)
          <input value={altitude} onChange={(e) => setAltitude(e.currentTarget.value)} inputMode="decimal" className={`${input} w-40`} />
        </label>
        <label className="flex flex-col gap-1 text-base font-bold">
          Sea-level pressure (weather report)
          <span className="flex gap-2">
            <input value={seaLevel} onChange={(e) => setSeaLevel(e.currentTarget.value)} inputMode="decimal" className={`${input} w-40`} />
            <select
              aria-label="Sea-level pressure unit"
              value={unit}
              onChange={(e) => setUnit(e.currentTarget.value === "kPa" ? "kPa" : "hPa")}
              className={`${input} w-28`}
            >
              <option value="hPa">hPa</option>
              <option value="kPa">kPa</option>
            </select>
          </span>
        </label>
        <button type="button" onClick={work} className="min-h-target rounded-lg border-2 border-ink bg-white px-5 text-lg font-bold">
          Work it out
        </button>
      </div>
      {result && (
        <p
          role="status"
          className={`mt-2 rounded px-3 py-2 text-lg font-bold ${result.ok ? "bg-pass-light text-pass" : "bg-fail-light text-fail"}`}
        >
          {result.ok ? "✓ " : "✕ "}
          {result.text}
        </p>
      )}
    </details>
  );
}

// Records a new run: its facts, the tune and fuel, and the curve typed into a table, taken from a
// CSV file of our curve format, or from a logged file with the columns chosen.
export function RunForm({ workOrderId, tunes, mappings }: { workOrderId: string; tunes: TuneVersion[]; mappings: SavedMapping[] }) {
  const router = useRouter();
  const [source, setSource] = useState<Source>("csv");
  const [rows, setRows] = useState<Row[]>(blankRows(6));
  const [fileText, setFileText] = useState<string | null>(null);
  const [fileName, setFileName] = useState("");
  const [logged, setLogged] = useState<{ header: string[]; preview: string[][]; rows: MappingRow[] } | null>(null);
  const [fieldErrors, setFieldErrors] = useState<Record<string, string>>({});
  const [curveErrors, setCurveErrors] = useState<CurveRowError[]>([]);
  const [message, setMessage] = useState<FormOutcome | null>(null);
  const [busy, setBusy] = useState(false);
  // the figures the live checks read
  const [pressure, setPressure] = useState("");
  const [temperature, setTemperature] = useState("");
  const [humidity, setHumidity] = useState("");
  const [standard, setStandard] = useState<(typeof POWER_CORRECTION_STANDARD_IDS)[number]>("SAE_J1349");
  const [boost, setBoost] = useState("");
  const [boostUnit, setBoostUnit] = useState<(typeof BOOST_UNITS)[number]>("psi");
  const newestTune = tunes.at(-1)?.id ?? "";

  const boostProblem = numberOrNull(boost) === null ? null : boostTargetProblem(Number(boost), boostUnit);
  let validity: ReturnType<typeof correctionValidity> | null = null;
  try {
    const p = numberOrNull(pressure);
    const t = numberOrNull(temperature);
    const h = numberOrNull(humidity);
    if (p !== null && t !== null && h !== null) {
      validity = correctionValidity(standard, { pressureKpa: p, temperatureC: t, vaporPressureKpa: vaporPressureKpa(t, h) });
    }
  } catch {
    validity = null; // the fields' own checks say what is wrong on saving
  }

  async function chooseFile(f: File | undefined, kind: Source) {
    setFileName(f?.name ?? "");
    const text = f ? await f.text() : null;
    setFileText(text);
    if (kind === "mapped-csv") {
      if (!text) return setLogged(null);
      const { header, rows: preview } = previewOf(text);
      setLogged({ header, preview, rows: guessMapping(header) });
    }
  }

  async function submit(form: HTMLFormElement) {
    setBusy(true);
    setMessage(null);
    const data = new FormData(form);
    const get = (k: string) => String(data.get(k) ?? "");
    const tune = get("tuneVersionId");
    const body = {
      label: get("label"),
      ranOn: get("ranOn"),
      boostTarget: boost,
      boostUnit,
      pressureKpa: pressure,
      temperatureC: temperature,
      humidityPercent: humidity,
      standard,
      notes: get("notes"),
      fuel: get("fuel"),
      tuneVersionId: tune === "" ? null : tune,
      curve:
        source === "table"
          ? { source, torqueUnit: get("torqueUnit"), rows }
          : source === "csv"
            ? { source, fileName, text: fileText ?? "" }
            : { source, fileName, text: fileText ?? "", mapping: mappingOf(logged?.rows ?? []) },
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
        setLogged(null);
        setPressure("");
        setTemperature("");
        setHumidity("");
        setBoost("");
        setMessage({ ok: true, text: `Run “${body.label}” saved.` });
        router.refresh();
      } else {
        const problems = runProblems(json.issues ?? []);
        setFieldErrors(problems.fieldErrors);
        setCurveErrors(problems.curveErrors);
        if (source !== "table" && !fileText) setCurveErrors([{ row: 1, column: "(file)", message: "Choose a CSV file first" }]);
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
          <Field
            id="boostTarget"
            label="Boost target"
            error={fieldErrors.boostTarget ?? fieldErrors.boostUnit ?? boostProblem ?? undefined}
          >
            <div className="flex gap-2">
              <input
                id="boostTarget"
                value={boost}
                onChange={(e) => setBoost(e.currentTarget.value)}
                inputMode="decimal"
                className={input}
              />
              <select
                aria-label="Boost unit"
                value={boostUnit}
                onChange={(e) => setBoostUnit(BOOST_UNITS.find((u) => u === e.currentTarget.value) ?? "psi")}
                className={`${input} w-28`}
              >
                {BOOST_UNITS.map((u) => (
                  <option key={u}>{u}</option>
                ))}
              </select>
            </div>
          </Field>
          <Field id="pressureKpa" label="Air pressure (kPa)" error={fieldErrors.pressureKpa}>
            <input
              id="pressureKpa"
              value={pressure}
              onChange={(e) => setPressure(e.currentTarget.value)}
              inputMode="decimal"
              className={input}
            />
            <span className="text-base">At the dyno (station pressure), not the weather report&apos;s sea-level figure.</span>
          </Field>
          <Field id="temperatureC" label="Air temperature (°C)" error={fieldErrors.temperatureC}>
            <input
              id="temperatureC"
              value={temperature}
              onChange={(e) => setTemperature(e.currentTarget.value)}
              inputMode="decimal"
              className={input}
            />
          </Field>
          <Field id="humidityPercent" label="Humidity (%)" error={fieldErrors.humidityPercent}>
            <input
              id="humidityPercent"
              value={humidity}
              onChange={(e) => setHumidity(e.currentTarget.value)}
              inputMode="decimal"
              className={input}
            />
          </Field>
          <StationPressureHelper onResult={setPressure} />
          <Field id="standard" label="Correct to" error={fieldErrors.standard}>
            <select
              id="standard"
              value={standard}
              onChange={(e) => setStandard(POWER_CORRECTION_STANDARD_IDS.find((s) => s === e.currentTarget.value) ?? "SAE_J1349")}
              className={input}
            >
              {POWER_CORRECTION_STANDARD_IDS.map((s) => (
                <option key={s} value={s}>
                  {POWER_CORRECTION_STANDARDS[s].label}
                </option>
              ))}
            </select>
            <span className="text-base" data-testid="validity-range">
              {validityRangeWords(standard)}
            </span>
            {validity && !validity.inside && (
              <span
                className="rounded border-2 border-warn bg-warn-light p-2 text-base font-bold text-warn"
                data-testid="form-validity-warning"
              >
                ⚠ {validity.outside.map((o) => o.message).join(" ")}
              </span>
            )}
          </Field>
          <Field id="fuel" label="Fuel" error={fieldErrors.fuel}>
            <select id="fuel" name="fuel" defaultValue="petrol" className={input}>
              {FUEL_IDS.map((f) => (
                <option key={f} value={f}>
                  {FUELS[f].label} (stoichiometric {FUELS[f].stoichiometricAfr.toFixed(2)})
                </option>
              ))}
            </select>
          </Field>
          <Field id="tuneVersionId" label="Tune on the bike" error={fieldErrors.tuneVersionId}>
            <select id="tuneVersionId" name="tuneVersionId" defaultValue={newestTune} className={input}>
              {[...tunes].reverse().map((t) => (
                <option key={t.id} value={t.id}>
                  {t.label} ({t.fileName})
                </option>
              ))}
              <option value="">No tune file of ours (stock or not recorded)</option>
            </select>
          </Field>
          <div className="md:col-span-3">
            <p className="text-base text-steel-700">
              {STATION_PRESSURE_NOTE} {BOOSTED_ENGINE_CAUTION}
            </p>
          </div>
          <div className="md:col-span-3">
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
              { value: "mapped-csv", label: "Logged file, choose columns" },
              { value: "table", label: "Typed in" },
            ]}
            value={source}
            onChange={(s) => {
              setSource(s);
              setFileText(null);
              setFileName("");
              setLogged(null);
              setCurveErrors([]);
            }}
          />
          {source === "csv" && (
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
                onChange={(e) => void chooseFile(e.currentTarget.files?.[0], "csv")}
              />
            </div>
          )}
          {source === "mapped-csv" && (
            <div className="flex flex-col gap-3">
              <label htmlFor="logged-file" className="text-base">
                Logged file: line 1 names the columns; commas, semicolons or tabs; <code className="font-mono">.</code> as the decimal mark;
                rpm rising. You choose which column is engine speed, torque and each logged channel, and its unit.
              </label>
              <input
                id="logged-file"
                type="file"
                accept=".csv,.txt,text/csv,text/plain"
                className="min-h-target text-lg file:mr-4 file:min-h-target file:rounded-lg file:border-2 file:border-ink file:bg-white file:px-4 file:text-lg file:font-bold"
                onChange={(e) => void chooseFile(e.currentTarget.files?.[0], "mapped-csv")}
              />
              {logged && (
                <ColumnMappingStep
                  header={logged.header}
                  preview={logged.preview}
                  rows={logged.rows}
                  onChange={(r) => setLogged({ ...logged, rows: r })}
                  mappings={mappings}
                />
              )}
            </div>
          )}
          {source === "table" && (
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
                ✕ The curve has {curveErrors.length} problem{curveErrors.length === 1 ? "" : "s"}; nothing of it was kept:
              </p>
              <ul className="mt-1 list-disc pl-6 text-lg">
                {curveErrors.slice(0, 50).map((e, i) => (
                  <li key={i}>
                    {source === "table" ? "Row" : "Line"} {e.row}, {e.column}: {e.message}
                  </li>
                ))}
                {curveErrors.length > 50 && <li>… and {curveErrors.length - 50} more.</li>}
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
          <FormStatus message={message} testId="form-message" />
        </div>
      </form>
    </section>
  );
}
