"use client";

import { useState } from "react";
import {
  chargeDensityKgM3,
  compressorOutletTemperatureK,
  convertPressure,
  intercoolerOutletTemperatureK,
  pressureRatioFromBoost,
} from "@/lib/calc";
import { fixed, NumberField, readNumber } from "./number-field";

const START = { inletC: "25", boostPsi: "10", ambientKpa: "101.3", efficiency: "72", effectiveness: "75" };
const K = 273.15;

// What boost does to the charge temperature, and what an intercooler takes back.
export function ChargeAirCard() {
  const [v, setV] = useState(START);
  const set = (k: keyof typeof START) => (x: string) => setV({ ...v, [k]: x });
  let r: { pr: number; hotC: number; coolC: number; hotRho: number; coolRho: number; ambientRho: number } | null = null;
  let error: string | null = null;
  try {
    const inletK = readNumber("Inlet air", v.inletC) + K;
    const ambient = readNumber("Ambient pressure", v.ambientKpa);
    const boostKpa = convertPressure(readNumber("Boost", v.boostPsi), "psi", "kPa");
    const pr = pressureRatioFromBoost(boostKpa, ambient);
    const hot = compressorOutletTemperatureK(inletK, pr, readNumber("Compressor efficiency", v.efficiency) / 100);
    const cool = intercoolerOutletTemperatureK(hot, inletK, readNumber("Intercooler effectiveness", v.effectiveness) / 100);
    const manifold = ambient + boostKpa;
    r = {
      pr,
      hotC: hot - K,
      coolC: cool - K,
      hotRho: chargeDensityKgM3(manifold, hot),
      coolRho: chargeDensityKgM3(manifold, cool),
      ambientRho: chargeDensityKgM3(ambient, inletK),
    };
  } catch (e) {
    error = (e as Error).message;
  }
  return (
    <section aria-labelledby="ca-h" className="rounded-xl border-2 border-steel-300 bg-white p-4">
      <h2 id="ca-h" className="text-2xl font-bold">
        Charge air
      </h2>
      <div className="mt-3 grid grid-cols-2 gap-3 md:grid-cols-5">
        <NumberField id="ca-inlet" label="Inlet air" unit="°C" value={v.inletC} onChange={set("inletC")} />
        <NumberField id="ca-boost" label="Boost" unit="psi" value={v.boostPsi} onChange={set("boostPsi")} />
        <NumberField id="ca-amb" label="Ambient pressure" unit="kPa" value={v.ambientKpa} onChange={set("ambientKpa")} />
        <NumberField id="ca-eff" label="Compressor efficiency" unit="%" value={v.efficiency} onChange={set("efficiency")} />
        <NumberField id="ca-ic" label="Intercooler effectiveness" unit="%" value={v.effectiveness} onChange={set("effectiveness")} />
      </div>
      {error ? (
        <p role="alert" className="mt-3 text-lg font-bold text-fail" data-testid="ca-error">
          {error}
        </p>
      ) : (
        r && (
          <dl className="mt-3 grid grid-cols-2 gap-2 font-mono text-lg md:grid-cols-4" data-testid="ca-result">
            <dt className="font-sans font-bold">Pressure ratio</dt>
            <dd>{fixed(r.pr, 3)}</dd>
            <dt className="font-sans font-bold">After the compressor</dt>
            <dd>{fixed(r.hotC, 1)} °C</dd>
            <dt className="font-sans font-bold">After the intercooler</dt>
            <dd>{fixed(r.coolC, 1)} °C</dd>
            <dt className="font-sans font-bold">Charge density, cooled</dt>
            <dd>
              {fixed(r.coolRho, 3)} kg/m³ ({fixed((r.coolRho / r.ambientRho) * 100, 0)} % of ambient; uncooled {fixed(r.hotRho, 3)})
            </dd>
          </dl>
        )
      )}
      <p className="mt-3 text-base">
        Charge pipes routed near the exhaust pick up heat and undo the intercooler&apos;s work (common practice). Boost pipework and
        intercoolers are hot after a run; let them cool before you touch them.
      </p>
    </section>
  );
}
