"use client";

import { convertPower, convertTorque, FUELS, POWER_CORRECTION_STANDARDS, validityRangeWords, type PowerUnit } from "@/lib/calc";
import { CHANNELS, type DynoRunSummary } from "@/lib/dyno";
import { runColour } from "./run-colours";

type TorqueDisplayUnit = "N·m" | "lbf·ft";

const f1 = (n: number) => n.toFixed(1);

// The figures of each run: conditions, the tune and fuel, the correction (with its validity range
// and a warning outside it), peaks and the channels it logged.
export function RunFigures({
  runs,
  indexOf,
  powerUnit,
  torqueUnit,
}: {
  runs: DynoRunSummary[];
  indexOf: (id: string) => number;
  powerUnit: PowerUnit;
  torqueUnit: TorqueDisplayUnit;
}) {
  const p = (kw: number) => convertPower(kw, "kW", powerUnit);
  const t = (nm: number) => convertTorque(nm, "N·m", torqueUnit);
  return (
    <div className="overflow-x-auto">
      <table className="w-full border-collapse text-left text-lg" data-testid="run-figures">
        <thead>
          <tr className="border-b-2 border-steel-700">
            <th className="py-2 pr-3">Run</th>
            <th className="py-2 pr-3">Air</th>
            <th className="py-2 pr-3">Correction</th>
            <th className="py-2 pr-3">Peak power ({powerUnit})</th>
            <th className="py-2 pr-3">Peak torque ({torqueUnit})</th>
          </tr>
        </thead>
        <tbody>
          {runs.map((r) => (
            <tr key={r.id} className="border-b border-steel-300 align-top">
              <td className="py-2 pr-3">
                <span className="flex items-center gap-2 font-bold">
                  <span aria-hidden="true" className="inline-block h-1 w-8" style={{ background: runColour(indexOf(r.id)) }} />
                  {r.label}
                </span>
                <span className="block text-base">
                  {r.ranOn} · {r.boostTarget} {r.boostUnit} target
                </span>
                <span className="block text-base" data-testid="run-tune">
                  Tune: {r.tune ? <strong>{r.tune.label}</strong> : "none named"}
                  {r.fuel && <> · {FUELS[r.fuel].label}</>}
                </span>
                {r.channels.length > 0 && (
                  <span className="block text-base text-steel-700">
                    Logged: {r.channels.map((c) => `${CHANNELS[c.channel].label.toLowerCase()} (${c.unit})`).join(", ")}
                  </span>
                )}
                {r.notes && <span className="block text-base text-steel-700">{r.notes}</span>}
              </td>
              <td className="py-2 pr-3 font-mono text-base">
                <span className="block whitespace-nowrap">{r.pressureKpa} kPa</span>
                <span className="block whitespace-nowrap">{r.temperatureC} °C</span>
                <span className="block whitespace-nowrap">{r.humidityPercent} % RH</span>
              </td>
              <td className="py-2 pr-3 text-base" data-testid="run-correction">
                {r.standardLabel}
                <br />
                <span className="font-mono">× {r.curve.factor.toFixed(4)}</span>
                {r.correctedTo !== r.standard && (
                  <span className="block text-steel-700">recorded under {POWER_CORRECTION_STANDARDS[r.standard].label}</span>
                )}
                {r.correctedTo !== "as-measured" && <span className="block text-steel-700">{validityRangeWords(r.correctedTo)}</span>}
                {r.validity && !r.validity.inside && (
                  <span
                    className="mt-1 block rounded border-2 border-warn bg-warn-light p-2 font-bold text-warn"
                    data-testid="validity-warning"
                  >
                    ⚠ Outside its validity range: {r.validity.outside.map((o) => o.message).join(" ")}
                  </span>
                )}
              </td>
              <td className="py-2 pr-3 font-mono" data-testid="peak-power">
                <strong>{f1(p(r.curve.peaks.correctedPowerKw.value))}</strong> at {r.curve.peaks.correctedPowerKw.rpm}
                <br />
                <span className="text-base">observed {f1(p(r.curve.peaks.observedPowerKw.value))}</span>
              </td>
              <td className="py-2 pr-3 font-mono" data-testid="peak-torque">
                <strong>{f1(t(r.curve.peaks.correctedTorqueNm.value))}</strong> at {r.curve.peaks.correctedTorqueNm.rpm}
                <br />
                <span className="text-base">observed {f1(t(r.curve.peaks.observedTorqueNm.value))}</span>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
