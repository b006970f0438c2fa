"use client";

import { useRouter } from "next/navigation";
import { useState, type ReactNode } from "react";
import {
  boostedDynamicCompressionRatio,
  checkCompressorMapOutline,
  checkOperatingPoints,
  compressorOperatingPoints,
  FUEL_IDS,
  FUELS,
  fuelPressureUnderBoost,
  fuelPumpFlowNeeded,
  injectorDutyCycle,
  injectorFlowAtPressure,
  KELVIN_AT_0_C,
  MAP_FLOW_UNITS,
  meanPistonSpeedMS,
  requiredInjectorFlowCcMin,
  rodRatio,
  squishClearanceMm,
  type CheckedMapOutline,
  type FuelId,
  type MapFlowUnit,
} from "@/lib/calc";
import type { SheetField } from "@/lib/build-figures/build-sheet";
import { outlineLinesText, parseOutlineLines } from "@/lib/build-figures/outline-text";
import { CompressorMapChart, POINT_LOOK, type ChartPoint } from "./compressor-map-chart";
import { fixed } from "./number-field";
import { AIR_FIELDS, CRANK_FIELDS, FUEL_FIELDS, TARGET_FIELDS } from "./planner-fields";
import { kpaText, readSheetField, SheetNumberField, sheetFigures, type SheetForm } from "./sheet-field";

function attempt<T>(f: () => T): { value: T; error: null } | { value: null; error: string } {
  try {
    return { value: f(), error: null };
  } catch (e) {
    return { value: null, error: (e as Error).message };
  }
}

function Card({ id, title, children }: { id: string; title: string; children: ReactNode }) {
  return (
    <section aria-labelledby={`${id}-h`} className="rounded-xl border-2 border-steel-300 bg-white p-4">
      <h3 id={`${id}-h`} className="text-2xl font-bold">
        {title}
      </h3>
      {children}
    </section>
  );
}

function Fields({
  keys,
  form,
  set,
  prefix,
}: {
  keys: SheetField[];
  form: SheetForm;
  set: (f: SheetField, v: string) => void;
  prefix: string;
}) {
  return (
    <div className="mt-3 grid grid-cols-2 gap-4 md:grid-cols-4">
      {keys.map((k) => (
        <SheetNumberField key={k} field={k} form={form} set={set} idPrefix={prefix} />
      ))}
    </div>
  );
}

function Problem({ text, testId }: { text: string; testId?: string }) {
  return (
    <p role="alert" className="mt-3 rounded bg-fail-light px-3 py-2 text-lg font-bold text-fail" data-testid={testId}>
      ✕ {text}
    </p>
  );
}

/**
 * Turbo and fuel figures: compressor operating points across the rev range over a map outline the
 * user typed from the maker's sheet, injector size and duty with fuel pressure rising with boost,
 * fuel pump flow, dynamic compression (static and boosted), squish, mean piston speed and rod ratio.
 * The engine numbers page uses it with invented starting figures; a job's page with the job's own,
 * and a save button that keeps them (and the outline) on the job's build sheet.
 */
export function TurboPlanner({
  start,
  startFuel = "petrol",
  startOutline = null,
  saveUrl,
  extra,
}: {
  start: SheetForm;
  startFuel?: FuelId;
  startOutline?: CheckedMapOutline | null;
  /** Where the job's build sheet is saved; none on the engine numbers page. */
  saveUrl?: string;
  /** Shown under the save button (the job's build figures). */
  extra?: ReactNode;
}) {
  const router = useRouter();
  const [form, setForm] = useState<SheetForm>(start);
  const set = (f: SheetField, v: string) => setForm((old) => ({ ...old, [f]: v }));
  const [fuel, setFuel] = useState<FuelId>(startFuel);
  const [flowUnit, setFlowUnit] = useState<MapFlowUnit>(startOutline?.flowUnit ?? "lb/min");
  const [surgeText, setSurgeText] = useState(startOutline ? outlineLinesText(startOutline.surgeLine) : "");
  const [chokeText, setChokeText] = useState(startOutline ? outlineLinesText(startOutline.chokeLine) : "");
  const [saving, setSaving] = useState(false);
  const [outcome, setOutcome] = useState<{ ok: boolean; text: string; issues?: string[] } | null>(null);
  const n = (f: SheetField) => readSheetField(form, f);

  // --- the map outline the user typed ---
  const outlineTyped = surgeText.trim() !== "" || chokeText.trim() !== "";
  const outline = outlineTyped
    ? attempt(() =>
        checkCompressorMapOutline({
          flowUnit,
          surgeLine: parseOutlineLines(surgeText, "Surge line"),
          chokeLine: parseOutlineLines(chokeText, "Choke line"),
        }),
      )
    : null;

  // --- operating points across the rev range ---
  const ops = attempt(() => {
    const from = n("rpmFrom");
    const to = n("rpmTo");
    const step = n("rpmStep");
    if (!(to > from)) throw new Error(`Rev range to must be above rev range from (${from} rpm); got ${to} rpm.`);
    if ((to - from) / step > 200) throw new Error("Rev range: at most 200 speeds; take a larger step.");
    const rpm: number[] = [];
    for (let r = from; r <= to + 1e-9; r += step) rpm.push(Math.round(r));
    return compressorOperatingPoints({
      displacementCc: n("displacementCc"),
      rpm,
      volumetricEfficiency: n("volumetricEfficiencyPercent") / 100,
      boostKpa: n("boostKpa"),
      stationPressureKpa: n("stationPressureKpa"),
      ambientTempK: n("ambientC") + KELVIN_AT_0_C,
      filterLossKpa: n("filterLossKpa"),
      intercoolerDropKpa: n("intercoolerDropKpa"),
      pipingDropKpa: n("pipingDropKpa"),
      compressorEfficiency: n("compressorEfficiencyPercent") / 100,
      intercoolerEffectiveness: n("intercoolerEffectivenessPercent") / 100,
    });
  });
  const checks = ops.value && outline?.value ? attempt(() => checkOperatingPoints(outline.value, ops.value)) : null;
  const chartPoints: ChartPoint[] = (ops.value?.points ?? []).map((p, i) => ({
    rpm: p.rpm,
    flow: flowUnit === "lb/min" ? p.correctedFlowLbMin : p.correctedFlowKgS,
    pressureRatio: p.pressureRatio,
    status: checks?.value?.[i]?.status ?? "no-outline",
  }));
  const warnings = checks?.value?.filter((c) => c.status === "surge" || c.status === "choke" || c.status === "above-outline") ?? [];

  // --- fuel ---
  const fuelFigures = attempt(() => {
    const props = FUELS[fuel];
    const maxDuty = n("maxDutyPercent") / 100;
    const boost = n("boostKpa");
    const needAtMaxDuty = requiredInjectorFlowCcMin({
      powerKw: n("powerKw"),
      bsfcGPerKwh: n("bsfcGPerKwh"),
      injectors: n("injectors"),
      maxDuty,
      fuelDensityKgPerL: props.densityKgPerL,
    });
    const pressure = fuelPressureUnderBoost({
      basePressureKpa: n("baseFuelPressureKpa"),
      boostKpa: boost,
      riseRatio: n("regulatorRiseRatio"),
    });
    const flowThere = injectorFlowAtPressure(n("injectorRatedFlowCcMin"), n("injectorRatedPressureKpa"), pressure.acrossInjectorKpa);
    const duty = injectorDutyCycle(needAtMaxDuty * maxDuty, flowThere);
    const pump = fuelPumpFlowNeeded({
      powerKw: n("powerKw"),
      bsfcGPerKwh: n("bsfcGPerKwh"),
      fuelDensityKgPerL: props.densityKgPerL,
      basePressureKpa: n("baseFuelPressureKpa"),
      boostKpa: boost,
      riseRatio: n("regulatorRiseRatio"),
      marginFraction: n("pumpMarginPercent") / 100,
    });
    return { needAtMaxDuty, pressure, flowThere, duty, maxDuty, pump };
  });

  // --- crank and head ---
  const crank = attempt(() => {
    const stroke = n("strokeMm");
    const dcr = boostedDynamicCompressionRatio({
      boreMm: n("boreMm"),
      strokeMm: stroke,
      rodLengthMm: n("rodLengthMm"),
      staticCompressionRatio: n("targetCompressionRatio"),
      intakeClosesDegAbdc: n("intakeClosesDegAbdc"),
      boostKpa: n("boostKpa"),
      stationPressureKpa: n("stationPressureKpa"),
    });
    return { ...dcr, pistonSpeed: meanPistonSpeedMS(stroke, n("rpmTo")), rodRatio: rodRatio(n("rodLengthMm"), stroke) };
  });
  const squish = attempt(() => squishClearanceMm({ deckClearanceMm: n("deckClearanceMm"), compressedGasketMm: n("gasketThicknessMm") }));

  async function save() {
    if (!saveUrl) return;
    setSaving(true);
    setOutcome(null);
    try {
      let mapOutline: unknown = null;
      if (outlineTyped) {
        try {
          mapOutline = {
            flowUnit,
            surgeLine: parseOutlineLines(surgeText, "Surge line"),
            chokeLine: parseOutlineLines(chokeText, "Choke line"),
          };
        } catch (e) {
          setOutcome({ ok: false, text: (e as Error).message });
          return;
        }
      }
      const res = await fetch(saveUrl, {
        method: "POST",
        headers: { "content-type": "application/json" },
        body: JSON.stringify({ figures: sheetFigures(form), fuel, mapOutline }),
      });
      const body = (await res.json().catch(() => ({}))) as { error?: string; issues?: Array<{ message: string }> };
      if (res.ok) {
        setOutcome({ ok: true, text: "Saved on this job's build sheet." });
        router.refresh();
      } else setOutcome({ ok: false, text: body.error ?? `Not saved (${res.status}).`, issues: body.issues?.map((i) => i.message) });
    } catch {
      setOutcome({ ok: false, text: "Not saved: the server did not answer. Try again when the network is back." });
    } finally {
      setSaving(false);
    }
  }

  const prefix = saveUrl ? "job" : "tp";
  return (
    <div className="grid gap-6" data-testid="turbo-planner">
      {saveUrl && (
        <Card id={`${prefix}-targets`} title="Build sheet: targets and parts makers' figures">
          <p className="mt-2 text-base">
            Figures the bench does not measure (piston dish, gasket bore, rod length, the cam card&apos;s intake closing) and the targets.
            Measured readings always take the place of a figure typed here.
          </p>
          <Fields keys={TARGET_FIELDS} form={form} set={set} prefix={`${prefix}-t`} />
          {extra}
        </Card>
      )}

      <Card id={`${prefix}-air`} title="Compressor operating points">
        <p className="mt-2 text-base">
          Air the engine takes at each speed, corrected to 101.325 kPa and 15 °C (ISO 2533 sea level), and the pressure ratio the compressor
          must make: boost plus the intercooler and piping drops, over the filter loss. Use the map&apos;s own reference if its sheet names
          another.
        </p>
        <Fields keys={AIR_FIELDS} form={form} set={set} prefix={`${prefix}-a`} />
        <h4 className="mt-4 text-xl font-bold">Compressor map outline (from the maker&apos;s sheet)</h4>
        <p className="text-base">
          Read the points off the compressor maker&apos;s map: one point a line, corrected flow then pressure ratio. Benchtag ships no maps.
        </p>
        <div className="mt-2 grid gap-4 md:grid-cols-3">
          <label htmlFor={`${prefix}-flow-unit`} className="flex flex-col gap-1 text-base font-bold">
            Flow axis of the map
            <select
              id={`${prefix}-flow-unit`}
              value={flowUnit}
              onChange={(e) => setFlowUnit(e.target.value as MapFlowUnit)}
              className="min-h-12 rounded-lg border-2 border-steel-700 bg-white px-3 text-lg"
            >
              {MAP_FLOW_UNITS.map((u) => (
                <option key={u}>{u}</option>
              ))}
            </select>
          </label>
          <label htmlFor={`${prefix}-surge`} className="flex flex-col gap-1 text-base font-bold">
            Surge line points (flow, pressure ratio)
            <textarea
              id={`${prefix}-surge`}
              rows={5}
              value={surgeText}
              onChange={(e) => setSurgeText(e.target.value)}
              className="rounded-lg border-2 border-steel-700 bg-white p-2 font-mono text-lg"
              placeholder={"8, 1.4\n11, 2.0\n14, 2.6"}
            />
          </label>
          <label htmlFor={`${prefix}-choke`} className="flex flex-col gap-1 text-base font-bold">
            Choke points (flow, pressure ratio)
            <textarea
              id={`${prefix}-choke`}
              rows={5}
              value={chokeText}
              onChange={(e) => setChokeText(e.target.value)}
              className="rounded-lg border-2 border-steel-700 bg-white p-2 font-mono text-lg"
              placeholder={"30, 1.4\n32, 2.0\n31, 2.6"}
            />
          </label>
        </div>
        {outline?.error && <Problem text={outline.error} testId="outline-error" />}
        {ops.error ? (
          <Problem text={ops.error} testId="ops-error" />
        ) : (
          <>
            {checks?.error && <Problem text={checks.error} />}
            <div className="mt-4">
              <CompressorMapChart outline={outline?.value ?? null} points={chartPoints} flowUnit={flowUnit} />
            </div>
            {warnings.length > 0 && (
              <div role="alert" className="mt-3 rounded-lg border-2 border-fail bg-fail-light p-3 text-lg" data-testid="map-warnings">
                <p className="font-bold text-fail">
                  ▲ The compressor is outside its map at {warnings.length} of {chartPoints.length} speeds:
                </p>
                <ul className="list-disc pl-6">
                  {warnings.map((w) => (
                    <li key={w.rpm}>{w.message}</li>
                  ))}
                </ul>
                <p>
                  Left of the surge line the flow stalls and reverses (a flutter you hear and feel as boost falls away); right of the choke
                  line the compressor is past its flow and only heats the air. Choose another compressor, or change boost or rev range, and
                  check again.
                </p>
              </div>
            )}
            <table className="mt-3 w-full text-left text-lg" data-testid="operating-points">
              <thead>
                <tr>
                  <th>Engine speed</th>
                  <th>Corrected flow</th>
                  <th>Pressure ratio</th>
                  <th>Manifold air</th>
                  <th>On the map</th>
                </tr>
              </thead>
              <tbody className="font-mono">
                {(ops.value?.points ?? []).map((p, i) => {
                  const look = POINT_LOOK[chartPoints[i].status];
                  return (
                    <tr key={p.rpm} className="border-t border-steel-300">
                      <td>{p.rpm} rpm</td>
                      <td>{flowUnit === "lb/min" ? `${fixed(p.correctedFlowLbMin, 1)} lb/min` : `${fixed(p.correctedFlowKgS, 3)} kg/s`}</td>
                      <td>{fixed(p.pressureRatio, 2)}</td>
                      <td>{fixed(p.manifoldTempK - KELVIN_AT_0_C, 0)} °C</td>
                      <td>
                        <span className={`inline-block rounded px-2 font-sans font-bold ${look.className}`}>
                          {look.sign} {look.words}
                        </span>
                      </td>
                    </tr>
                  );
                })}
              </tbody>
            </table>
          </>
        )}
      </Card>

      <Card id={`${prefix}-fuel`} title="Injectors and fuel pump">
        <p className="mt-2 text-base">
          BSFC method (common practice): fuel = power × BSFC, shared by the injectors. Boosted petrol engines use about 365–395 g/kWh
          (0.60–0.65 lb/hp·h), common practice. Fuel pressure rises with boost by the regulator&apos;s ratio (1 for a boost-referenced
          regulator).
        </p>
        <div className="mt-3 grid grid-cols-2 gap-4 md:grid-cols-4">
          <label htmlFor={`${prefix}-fuel-id`} className="flex flex-col gap-1 text-base font-bold">
            Fuel
            <select
              id={`${prefix}-fuel-id`}
              value={fuel}
              onChange={(e) => setFuel(e.target.value as FuelId)}
              className="min-h-12 rounded-lg border-2 border-steel-700 bg-white px-3 text-lg"
            >
              {FUEL_IDS.map((f) => (
                <option key={f} value={f}>
                  {FUELS[f].label}
                </option>
              ))}
            </select>
          </label>
        </div>
        <Fields keys={FUEL_FIELDS} form={form} set={set} prefix={`${prefix}-f`} />
        {fuelFigures.value === null ? (
          <Problem text={fuelFigures.error ?? ""} testId="fuel-error" />
        ) : (
          <dl className="mt-3 grid grid-cols-2 gap-2 font-mono text-lg md:grid-cols-4" data-testid="fuel-result">
            <dt className="font-sans font-bold">Injector size needed</dt>
            <dd>
              {fixed(fuelFigures.value.needAtMaxDuty, 0)} cc/min each at {fixed(fuelFigures.value.maxDuty * 100, 0)} % duty
            </dd>
            <dt className="font-sans font-bold">Rail pressure at full boost</dt>
            <dd>
              {kpaText(fuelFigures.value.pressure.railGaugeKpa)} (across the injector{" "}
              {kpaText(fuelFigures.value.pressure.acrossInjectorKpa)})
            </dd>
            <dt className="font-sans font-bold">Your injectors there</dt>
            <dd>{fixed(fuelFigures.value.flowThere, 0)} cc/min</dd>
            <dt className="font-sans font-bold">Duty cycle at the target</dt>
            <dd>
              <span
                className={`rounded px-2 font-sans font-bold ${fuelFigures.value.duty > fuelFigures.value.maxDuty ? "bg-fail-light text-fail" : "bg-pass-light text-pass"}`}
                data-testid="duty"
              >
                {fuelFigures.value.duty > fuelFigures.value.maxDuty ? "✕" : "✓"} {fixed(fuelFigures.value.duty * 100, 0)} %{" "}
                {fuelFigures.value.duty > 1
                  ? "— these injectors cannot deliver it"
                  : fuelFigures.value.duty > fuelFigures.value.maxDuty
                    ? "— above the highest duty you planned"
                    : "— room to spare"}
              </span>
            </dd>
            <dt className="font-sans font-bold">Fuel pump must deliver</dt>
            <dd>
              {fixed(fuelFigures.value.pump.flowLh, 0)} L/h at {kpaText(fuelFigures.value.pump.pressureKpa)} (read the pump&apos;s chart
              there, at the voltage it will see)
            </dd>
          </dl>
        )}
      </Card>

      <Card id={`${prefix}-crank`} title="Dynamic compression, squish, piston speed">
        <p className="mt-2 text-base">
          Dynamic compression starts when the intake valve closes (use the cam card&apos;s figure and say at which lift). The boosted forms
          are the trade&apos;s rule of thumb, ratio × absolute manifold pressure ÷ air pressure: a way to compare builds, not a knock limit.
        </p>
        <Fields keys={CRANK_FIELDS} form={form} set={set} prefix={`${prefix}-c`} />
        {crank.value === null ? (
          <Problem text={crank.error ?? ""} testId="crank-error" />
        ) : (
          <dl className="mt-3 grid grid-cols-2 gap-2 font-mono text-lg md:grid-cols-4" data-testid="crank-result">
            <dt className="font-sans font-bold">Dynamic compression</dt>
            <dd>{fixed(crank.value.dynamicRatio, 2)}:1</dd>
            <dt className="font-sans font-bold">Dynamic, boosted (rule of thumb)</dt>
            <dd>{fixed(crank.value.boostedRatio, 2)}:1</dd>
            <dt className="font-sans font-bold">Mean piston speed at {form.rpmTo} rpm</dt>
            <dd>{fixed(crank.value.pistonSpeed, 1)} m/s</dd>
            <dt className="font-sans font-bold">Rod ratio (rod ÷ stroke)</dt>
            <dd>{fixed(crank.value.rodRatio, 2)}</dd>
          </dl>
        )}
        {squish.value === null ? (
          <Problem text={squish.error ?? ""} testId="squish-error" />
        ) : (
          <p className="mt-2 font-mono text-lg" data-testid="squish-result">
            <span className="font-sans font-bold">Squish clearance</span> {fixed(squish.value, 2)} mm — check with solder or clay at
            assembly; rod stretch at speed takes some of it.
          </p>
        )}
      </Card>

      {saveUrl && (
        <div className="flex flex-wrap items-center gap-4">
          <button
            type="button"
            onClick={save}
            disabled={saving}
            className="min-h-target rounded-xl bg-signal px-8 text-xl font-bold text-ink"
          >
            {saving ? "Saving…" : "Save on this job's build sheet"}
          </button>
          {outcome && (
            <div
              role="status"
              data-testid="sheet-outcome"
              className={`rounded px-3 py-2 text-lg font-bold ${outcome.ok ? "bg-pass-light text-pass" : "bg-fail-light text-fail"}`}
            >
              {outcome.ok ? "✓ " : "✕ "}
              {outcome.text}
              {outcome.issues && (
                <ul className="list-disc pl-6 font-normal">
                  {outcome.issues.map((m) => (
                    <li key={m}>{m}</li>
                  ))}
                </ul>
              )}
            </div>
          )}
        </div>
      )}
    </div>
  );
}
