"use client";

import { useState } from "react";
import { describeRange, INPUT_RULES, intercoolerFromLog, KELVIN_AT_0_C, type IntercoolerLogResult, type QuantityRule } from "@/lib/calc";
import type { IntercoolerFromRun } from "@/lib/build-figures/intercooler-from-run";
import { fixed, NumberField, readNumber } from "./number-field";

const toC = (rule: QuantityRule): string =>
  describeRange({
    ...rule,
    unit: "°C",
    min: Number((rule.min - KELVIN_AT_0_C).toFixed(2)),
    max: Number((rule.max - KELVIN_AT_0_C).toFixed(2)),
  });

function Result({ r }: { r: IntercoolerLogResult }) {
  const odd = r.effectiveness > 1 || r.effectiveness < 0;
  return (
    <dl className="mt-3 grid grid-cols-2 gap-2 font-mono text-lg md:grid-cols-4" data-testid="ic-result">
      <dt className="font-sans font-bold">Effectiveness</dt>
      <dd>
        {fixed(r.effectiveness * 100, 0)} %{odd ? " — outside 0–100 %: check the sensors" : ""}
      </dd>
      <dt className="font-sans font-bold">Temperature taken out</dt>
      <dd>{fixed(r.temperatureDropK, 1)} °C</dd>
      <dt className="font-sans font-bold">Pressure drop</dt>
      <dd>
        {r.pressureDropKpa === null
          ? "not logged"
          : `${fixed(r.pressureDropKpa, 1)} kPa (${fixed((r.pressureDropFraction ?? 0) * 100, 1)} %)`}
      </dd>
    </dl>
  );
}

/** Intercooler effectiveness and pressure drop from logged temperatures and pressures; a job's page passes the figures of its newest run that logged them. */
export function IntercoolerCard({ fromRun }: { fromRun?: IntercoolerFromRun | null }) {
  const [v, setV] = useState({ inC: "95", outC: "42", ambC: "25", pIn: "178", pOut: "171" });
  const set = (k: keyof typeof v) => (x: string) => setV({ ...v, [k]: x });
  let r: IntercoolerLogResult | null = null;
  let error: string | null = null;
  try {
    const both = v.pIn.trim() !== "" || v.pOut.trim() !== "";
    r = intercoolerFromLog({
      inletTempK: readNumber("Intercooler inlet temperature", v.inC) + KELVIN_AT_0_C,
      outletTempK: readNumber("Intercooler outlet temperature", v.outC) + KELVIN_AT_0_C,
      ambientTempK: readNumber("Ambient air temperature", v.ambC) + KELVIN_AT_0_C,
      ...(both
        ? {
            inletPressureKpa: readNumber("Pressure before the intercooler", v.pIn),
            outletPressureKpa: readNumber("Pressure after the intercooler", v.pOut),
          }
        : {}),
    });
  } catch (e) {
    error = (e as Error).message;
  }
  return (
    <section aria-labelledby="ic-h" className="rounded-xl border-2 border-steel-300 bg-white p-4">
      <h3 id="ic-h" className="text-2xl font-bold">
        Intercooler from logged figures
      </h3>
      <p className="mt-2 text-base">
        Effectiveness = (in − out) ÷ (in − ambient): 100 % would bring the charge down to the air around it. Pressures are absolute, before
        and after the intercooler.
      </p>
      {fromRun && (
        <div className="mt-3 rounded-lg border-2 border-steel-300 p-3" data-testid="ic-from-run">
          <p className="text-lg">
            From dyno run <strong>{fromRun.runLabel}</strong> at {fromRun.rpm} rpm (hottest charge): in {fixed(fromRun.inletC, 1)} °C, out{" "}
            {fixed(fromRun.outletC, 1)} °C, cell air {fixed(fromRun.ambientC, 1)} °C.
          </p>
          {fromRun.result ? <Result r={fromRun.result} /> : <p className="font-bold text-fail">✕ {fromRun.problem}</p>}
        </div>
      )}
      <div className="mt-3 grid grid-cols-2 gap-4 md:grid-cols-5">
        <NumberField
          id="ic-in"
          label="Charge into the intercooler"
          unit="°C"
          value={v.inC}
          onChange={set("inC")}
          hint={toC(INPUT_RULES.intercoolerInletTemperature)}
        />
        <NumberField
          id="ic-out"
          label="Charge out of the intercooler"
          unit="°C"
          value={v.outC}
          onChange={set("outC")}
          hint={toC(INPUT_RULES.intercoolerOutletTemperature)}
        />
        <NumberField
          id="ic-amb"
          label="Ambient air"
          unit="°C"
          value={v.ambC}
          onChange={set("ambC")}
          hint={toC(INPUT_RULES.ambientTemperature)}
        />
        <NumberField
          id="ic-pin"
          label="Pressure before (absolute)"
          unit="kPa"
          value={v.pIn}
          onChange={set("pIn")}
          hint={describeRange(INPUT_RULES.intercoolerInletPressure)}
        />
        <NumberField
          id="ic-pout"
          label="Pressure after (absolute)"
          unit="kPa"
          value={v.pOut}
          onChange={set("pOut")}
          hint={describeRange(INPUT_RULES.intercoolerOutletPressure)}
        />
      </div>
      {error ? (
        <p role="alert" className="mt-3 text-lg font-bold text-fail" data-testid="ic-error">
          ✕ {error}
        </p>
      ) : (
        r && <Result r={r} />
      )}
    </section>
  );
}
