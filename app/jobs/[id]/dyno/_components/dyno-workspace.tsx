"use client";

import { useEffect, useMemo, useRef, useState } from "react";
import { convertPower, convertTorque, type PowerUnit } from "@/lib/calc";
import { compareRuns, powerGainPerBoost, summariseRun, type StoredDynoRun } from "@/lib/dyno";
import { downloadPng, downloadSvg, type ExportLegendItem } from "./chart-export";
import { CurveChart, type ChartSeries } from "./curve-chart";
import { runColour } from "./run-colours";
import { RunFigures } from "./run-figures";
import { RunForm } from "./run-form";
import { ToggleGroup } from "./toggle-group";

type TorqueDisplayUnit = "N·m" | "lbf·ft";
type CurveKind = "corrected" | "observed";

const f1 = (n: number) => n.toFixed(1);
const signed = (n: number) => `${n >= 0 ? "+" : "−"}${f1(Math.abs(n))}`;

export function DynoWorkspace({ workOrderId, bikeName, runs }: { workOrderId: string; bikeName: string; runs: StoredDynoRun[] }) {
  const summaries = useMemo(() => runs.map(summariseRun), [runs]);
  const [chosen, setChosen] = useState<string[]>(() => runs.slice(-2).map((r) => r.id));
  const [powerUnit, setPowerUnit] = useState<PowerUnit>("kW");
  const [torqueUnit, setTorqueUnit] = useState<TorqueDisplayUnit>("N·m");
  const [kind, setKind] = useState<CurveKind>("corrected");
  const [exportError, setExportError] = useState<string | null>(null);
  const chartRef = useRef<HTMLDivElement>(null);
  // a run saved here joins the plot at once
  const known = useRef(new Set(runs.map((r) => r.id)));
  useEffect(() => {
    const fresh = runs.filter((r) => !known.current.has(r.id)).map((r) => r.id);
    fresh.forEach((id) => known.current.add(id));
    if (fresh.length) setChosen((c) => [...c, ...fresh]);
  }, [runs]);

  const indexOf = (id: string) => runs.findIndex((r) => r.id === id);
  const shown = summaries.filter((s) => chosen.includes(s.id));
  const p = (kw: number) => convertPower(kw, "kW", powerUnit);
  const t = (nm: number) => convertTorque(nm, "N·m", torqueUnit);

  const series: ChartSeries[] = shown.flatMap((s) => [
    {
      key: `${s.id}-power`,
      name: `${s.label}: power`,
      colour: runColour(indexOf(s.id)),
      dashed: false,
      axis: "left" as const,
      points: s.curve.points.map((pt) => ({ rpm: pt.rpm, value: p(kind === "corrected" ? pt.correctedPowerKw : pt.observedPowerKw) })),
    },
    {
      key: `${s.id}-torque`,
      name: `${s.label}: torque`,
      colour: runColour(indexOf(s.id)),
      dashed: true,
      axis: "right" as const,
      points: s.curve.points.map((pt) => ({ rpm: pt.rpm, value: t(kind === "corrected" ? pt.correctedTorqueNm : pt.observedTorqueNm) })),
    },
  ]);
  const legend: ExportLegendItem[] = series.map((s) => ({ label: s.name, colour: s.colour, dashed: s.dashed }));
  const title = `${bikeName}: ${kind} power (${powerUnit}) and torque (${torqueUnit})`;

  const comparison = shown.length >= 2 ? compareRuns(shown[0].curve, shown[shown.length - 1].curve, 250) : null;
  const base = shown[0];
  const other = shown[shown.length - 1];
  const gainPerPsi =
    comparison && base && other
      ? powerGainPerBoost(
          { powerKw: base.curve.peaks.correctedPowerKw.value, boost: { value: base.boostTarget, unit: base.boostUnit } },
          { powerKw: other.curve.peaks.correctedPowerKw.value, boost: { value: other.boostTarget, unit: other.boostUnit } },
          powerUnit,
          "psi",
        )
      : null;

  const toggleRun = (id: string) =>
    setChosen((c) => (c.includes(id) ? c.filter((x) => x !== id) : [...c, id].sort((a, b) => indexOf(a) - indexOf(b))));

  const exportChart = async (format: "svg" | "png") => {
    setExportError(null);
    try {
      if (!chartRef.current) throw new Error("The chart is not drawn yet.");
      const file = `dyno-${bikeName.toLowerCase().replace(/[^a-z0-9]+/g, "-")}.${format}`;
      if (format === "svg") downloadSvg(chartRef.current, title, legend, file);
      else await downloadPng(chartRef.current, title, legend, file);
    } catch (e) {
      setExportError(e instanceof Error ? e.message : "Export failed.");
    }
  };

  return (
    <div className="mt-6 flex flex-col gap-6">
      {runs.length === 0 ? (
        <p className="text-lg">No runs recorded yet. Add the first one below.</p>
      ) : (
        <>
          <section aria-labelledby="runs-heading" className="flex flex-col gap-3">
            <h2 id="runs-heading" className="text-2xl font-bold">
              Runs on the plot
            </h2>
            <div className="flex flex-wrap gap-3">
              {runs.map((r, i) => {
                const on = chosen.includes(r.id);
                return (
                  <button
                    key={r.id}
                    type="button"
                    aria-pressed={on}
                    onClick={() => toggleRun(r.id)}
                    className={`flex min-h-target items-center gap-3 rounded-lg border-2 px-4 text-lg font-bold ${on ? "border-ink bg-white" : "border-steel-300 bg-steel-50 text-steel-700"}`}
                  >
                    <span aria-hidden="true" className="inline-block h-1.5 w-8" style={{ background: on ? runColour(i) : "#a9b3bd" }} />
                    <span aria-hidden="true">{on ? "☑" : "☐"}</span>
                    {r.label}
                  </button>
                );
              })}
            </div>
          </section>

          <div className="flex flex-wrap items-end gap-6">
            <ToggleGroup
              label="Power in"
              options={[
                { value: "kW", label: "kW" },
                { value: "hp", label: "hp" },
              ]}
              value={powerUnit}
              onChange={setPowerUnit}
            />
            <ToggleGroup
              label="Torque in"
              options={[
                { value: "N·m", label: "N·m" },
                { value: "lbf·ft", label: "lbf·ft" },
              ]}
              value={torqueUnit}
              onChange={setTorqueUnit}
            />
            <ToggleGroup
              label="Curves"
              options={[
                { value: "corrected", label: "Corrected" },
                { value: "observed", label: "As measured" },
              ]}
              value={kind}
              onChange={setKind}
            />
          </div>

          {shown.length === 0 ? (
            <p className="text-lg">Choose at least one run to plot.</p>
          ) : (
            <section aria-label="Power and torque plot" className="flex flex-col gap-3">
              <p className="text-lg">
                <strong>{title}.</strong> Solid lines: power (left scale). Dashed lines: torque (right scale).
              </p>
              <CurveChart
                ref={chartRef}
                series={series}
                leftLabel={`Power (${powerUnit})`}
                rightLabel={`Torque (${torqueUnit})`}
                testId="curve-chart"
              />
              <ul className="flex flex-wrap gap-x-6 gap-y-1 text-base" aria-label="Legend">
                {legend.map((l) => (
                  <li key={l.label} className="flex items-center gap-2">
                    <svg width="36" height="8" aria-hidden="true">
                      <line x1="0" x2="36" y1="4" y2="4" stroke={l.colour} strokeWidth="3" strokeDasharray={l.dashed ? "8 5" : undefined} />
                    </svg>
                    {l.label}
                  </li>
                ))}
              </ul>
              <div className="flex flex-wrap gap-3">
                <button
                  type="button"
                  onClick={() => exportChart("svg")}
                  className="min-h-target rounded-lg border-2 border-ink bg-white px-5 text-lg font-bold"
                >
                  Save plot as SVG
                </button>
                <button
                  type="button"
                  onClick={() => exportChart("png")}
                  className="min-h-target rounded-lg border-2 border-ink bg-white px-5 text-lg font-bold"
                >
                  Save plot as PNG
                </button>
                {exportError && (
                  <p role="alert" className="self-center rounded bg-fail-light px-3 py-2 font-bold text-fail">
                    {exportError}
                  </p>
                )}
              </div>
            </section>
          )}

          {shown.length > 0 && <RunFigures runs={shown} indexOf={indexOf} powerUnit={powerUnit} torqueUnit={torqueUnit} />}

          {comparison && base && other && (
            <section aria-labelledby="compare-heading" className="flex flex-col gap-3" data-testid="comparison">
              <h2 id="compare-heading" className="text-2xl font-bold">
                {other.label} against {base.label}
              </h2>
              <ul className="grid gap-2 text-lg md:grid-cols-3">
                <li className="rounded-lg border-2 border-steel-300 bg-white p-3">
                  Peak power{" "}
                  <strong className="font-mono" data-testid="peak-power-delta">
                    {signed(p(comparison.peakDelta.powerKw))} {powerUnit}
                  </strong>{" "}
                  ({signed(comparison.peakDelta.powerPercent)} %)
                </li>
                <li className="rounded-lg border-2 border-steel-300 bg-white p-3">
                  Peak torque{" "}
                  <strong className="font-mono">
                    {signed(t(comparison.peakDelta.torqueNm))} {torqueUnit}
                  </strong>{" "}
                  ({signed(comparison.peakDelta.torquePercent)} %)
                </li>
                <li className="rounded-lg border-2 border-steel-300 bg-white p-3">
                  {gainPerPsi === null ? (
                    "Same boost target"
                  ) : (
                    <>
                      Each extra psi:{" "}
                      <strong className="font-mono">
                        {signed(gainPerPsi)} {powerUnit}
                      </strong>{" "}
                      at peak
                    </>
                  )}
                </li>
              </ul>
              {comparison.grid.length > 0 && (
                <>
                  <p className="text-lg">
                    Power difference at each 250 rpm where both runs have data
                    {comparison.largestGain && (
                      <>
                        ; largest gain {signed(p(comparison.largestGain.value))} {powerUnit} at {comparison.largestGain.rpm} rpm
                      </>
                    )}
                    .
                  </p>
                  <CurveChart
                    series={[
                      {
                        key: "delta",
                        name: "Power difference",
                        colour: "#111418",
                        dashed: false,
                        axis: "left",
                        points: comparison.grid.map((g) => ({ rpm: g.rpm, value: p(g.deltaPowerKw) })),
                      },
                    ]}
                    leftLabel={`Difference (${powerUnit})`}
                    zeroLine
                    height={260}
                    testId="delta-chart"
                  />
                </>
              )}
            </section>
          )}
        </>
      )}
      <RunForm workOrderId={workOrderId} />
    </div>
  );
}
