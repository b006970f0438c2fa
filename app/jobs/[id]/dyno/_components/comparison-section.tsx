"use client";

import { convertPower, convertPressure, convertTorque, type PowerUnit } from "@/lib/calc";
import type { DynoRunSummary, RunDifference } from "@/lib/dyno";
import { CurveChart } from "./curve-chart";

type TorqueDisplayUnit = "N·m" | "lbf·ft";

const f1 = (n: number) => n.toFixed(1);
const signed = (n: number) => `${n >= 0 ? "+" : "−"}${f1(Math.abs(n))}`;
const boostWords = (kpa: number) => `${signed(kpa)} kPa (${signed(convertPressure(kpa, "kPa", "psi"))} psi)`;

// Two runs compared honestly: both corrected to the one standard chosen above, power and torque at
// the same engine speeds, and the boost difference beside the power difference (no "per psi").
export function ComparisonSection({
  base,
  other,
  comparison,
  powerUnit,
  torqueUnit,
}: {
  base: DynoRunSummary;
  other: DynoRunSummary;
  comparison: RunDifference;
  powerUnit: PowerUnit;
  torqueUnit: TorqueDisplayUnit;
}) {
  const p = (kw: number) => convertPower(kw, "kW", powerUnit);
  const t = (nm: number) => convertTorque(nm, "N·m", torqueUnit);
  const rows = comparison.rows.filter((_, i) => i % 2 === 0 || i === comparison.rows.length - 1);
  const loggedBoost = comparison.rows.some((r) => r.deltaBoostKpa !== null);
  return (
    <section aria-labelledby="compare-heading" className="flex flex-col gap-3" data-testid="comparison">
      <h2 id="compare-heading" className="text-2xl font-bold">
        {other.label} against {base.label}
      </h2>
      <p className="text-lg" data-testid="compared-at">
        Both runs recomputed from their recorded torque and air to <strong>{base.standardLabel}</strong>; differences are read at the same
        engine speed.
      </p>
      <ul className="grid gap-4 text-lg md:grid-cols-3">
        <li className="rounded-lg border-2 border-steel-300 bg-white p-3">
          Peak power{" "}
          <strong className="font-mono" data-testid="peak-power-delta">
            {signed(p(comparison.peakDelta.powerKw))} {powerUnit}
          </strong>{" "}
          ({signed(comparison.peakDelta.powerPercent)} %) — {base.curve.peaks.correctedPowerKw.rpm} →{" "}
          {other.curve.peaks.correctedPowerKw.rpm} rpm
        </li>
        <li className="rounded-lg border-2 border-steel-300 bg-white p-3">
          Peak torque{" "}
          <strong className="font-mono">
            {signed(t(comparison.peakDelta.torqueNm))} {torqueUnit}
          </strong>{" "}
          ({signed(comparison.peakDelta.torquePercent)} %)
        </li>
        <li className="rounded-lg border-2 border-steel-300 bg-white p-3" data-testid="boost-delta">
          Boost target <strong className="font-mono">{boostWords(comparison.deltaBoostTargetKpa)}</strong>
          {comparison.deltaBoostTargetKpa !== 0 && <> — a power difference here comes with a boost difference.</>}
        </li>
      </ul>
      {comparison.rows.length > 0 ? (
        <>
          <p className="text-lg">
            Power difference at each 250 rpm where both runs have data
            {comparison.largestGain && (
              <>
                ; largest gain {signed(p(comparison.largestGain.value))} {powerUnit} at {comparison.largestGain.rpm} rpm
              </>
            )}
            .{loggedBoost ? " Logged boost difference beside it." : " Boost is not logged on both runs: only the targets compare."}
          </p>
          <CurveChart
            series={[
              {
                key: "delta",
                name: "Power difference",
                colour: "#111418",
                dashed: false,
                axis: "left",
                points: comparison.rows.map((g) => ({ rpm: g.rpm, value: p(g.deltaPowerKw) })),
              },
            ]}
            leftLabel={`Difference (${powerUnit})`}
            zeroLine
            height={260}
            testId="delta-chart"
          />
          <div className="overflow-x-auto">
            <table className="w-full border-collapse text-left font-mono text-lg" data-testid="same-rpm-table">
              <thead className="font-sans">
                <tr className="border-b-2 border-steel-700">
                  <th className="py-2 pr-3">rpm</th>
                  <th className="py-2 pr-3">
                    {base.label} ({powerUnit})
                  </th>
                  <th className="py-2 pr-3">
                    {other.label} ({powerUnit})
                  </th>
                  <th className="py-2 pr-3">Power difference</th>
                  <th className="py-2 pr-3">Boost difference</th>
                </tr>
              </thead>
              <tbody>
                {rows.map((r) => (
                  <tr key={r.rpm} className="border-b border-steel-300">
                    <td className="py-1 pr-3">{r.rpm}</td>
                    <td className="py-1 pr-3">{f1(p(r.basePowerKw))}</td>
                    <td className="py-1 pr-3">{f1(p(r.otherPowerKw))}</td>
                    <td className="py-1 pr-3">{signed(p(r.deltaPowerKw))}</td>
                    <td className="py-1 pr-3">{r.deltaBoostKpa === null ? "not logged" : `${signed(r.deltaBoostKpa)} kPa`}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </>
      ) : (
        <p className="text-lg">The two runs share no engine speeds: nothing to compare at the same rpm.</p>
      )}
    </section>
  );
}
