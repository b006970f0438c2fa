"use client";

import { useEffect, useMemo, useRef, useState } from "react";
import { convertPower, convertTorque, POWER_CORRECTION_STANDARD_IDS, POWER_CORRECTION_STANDARDS, type PowerUnit } from "@/lib/calc";
import {
  AS_MEASURED_LABEL,
  CHANNEL_IDS,
  CHANNELS,
  compareAtSameRpm,
  DEFAULT_MARK_LIMITS,
  marksOfRun,
  summariseRun,
  type ChannelId,
  type CorrectionChoice,
  type StoredDynoRun,
} from "@/lib/dyno";
import type { TuneVersion } from "@/lib/dyno/tune-version";
import { downloadPng, downloadSvg, type ExportLegendItem } from "./chart-export";
import { ComparisonSection } from "./comparison-section";
import { CurveChart, MARK_COLOURS, type ChartMark, type ChartSeries } from "./curve-chart";
import { runColour } from "./run-colours";
import { RunFigures } from "./run-figures";
import { RunForm, type SavedMapping } from "./run-form";
import { ToggleGroup } from "./toggle-group";

type TorqueDisplayUnit = "N·m" | "lbf·ft";

const selectClass = "min-h-target rounded-lg border-2 border-steel-700 bg-white px-3 text-lg";
const channelAxisLabel = (c: ChannelId) => (CHANNELS[c].baseUnit ? `${CHANNELS[c].label} (${CHANNELS[c].baseUnit})` : CHANNELS[c].label);

/** A number typed in a limit box, or the default when it is not a sensible one. */
function limitOr(text: string, fallback: number, min: number, max: number): number {
  const n = Number(text.trim());
  return text.trim() !== "" && Number.isFinite(n) && n >= min && n <= max ? n : fallback;
}

export function DynoWorkspace({
  workOrderId,
  bikeName,
  runs,
  tunes,
  mappings,
}: {
  workOrderId: string;
  bikeName: string;
  runs: StoredDynoRun[];
  tunes: TuneVersion[];
  mappings: SavedMapping[];
}) {
  const [chosen, setChosen] = useState<string[]>(() => runs.slice(-2).map((r) => r.id));
  const [powerUnit, setPowerUnit] = useState<PowerUnit>("kW");
  const [torqueUnit, setTorqueUnit] = useState<TorqueDisplayUnit>("N·m");
  // Every run is recomputed from its raw torque to one standard: by default the newest run's.
  const [correctedTo, setCorrectedTo] = useState<CorrectionChoice>(() => runs.at(-1)?.standard ?? "SAE_J1349");
  const [channel, setChannel] = useState<ChannelId | "none">("none");
  const [leanText, setLeanText] = useState(String(DEFAULT_MARK_LIMITS.leanAboveLambda));
  const [marginText, setMarginText] = useState(String(DEFAULT_MARK_LIMITS.overBoostMarginKpa));
  const [exportError, setExportError] = useState<string | null>(null);
  const chartRef = useRef<HTMLDivElement>(null);
  // a run saved here joins the plot at once
  const known = useRef(new Set(runs.map((r) => r.id)));
  useEffect(() => {
    const fresh = runs.filter((r) => !known.current.has(r.id)).map((r) => r.id);
    fresh.forEach((id) => known.current.add(id));
    if (fresh.length) setChosen((c) => [...c, ...fresh]);
  }, [runs]);

  const summaries = useMemo(() => runs.map((r) => summariseRun(r, correctedTo)), [runs, correctedTo]);
  const limits = {
    leanAboveLambda: limitOr(leanText, DEFAULT_MARK_LIMITS.leanAboveLambda, 0.5, 1.5),
    overBoostMarginKpa: limitOr(marginText, DEFAULT_MARK_LIMITS.overBoostMarginKpa, 0, 200),
  };
  const indexOf = (id: string) => runs.findIndex((r) => r.id === id);
  const shown = summaries.filter((s) => chosen.includes(s.id));
  const p = (kw: number) => convertPower(kw, "kW", powerUnit);
  const t = (nm: number) => convertTorque(nm, "N·m", torqueUnit);
  const loggedChannels = CHANNEL_IDS.filter((c) => shown.some((s) => (s.series[c] ?? []).length > 0));
  const channelShown = channel !== "none" && loggedChannels.includes(channel) ? channel : null;

  const series: ChartSeries[] = shown.flatMap((s) => [
    {
      key: `${s.id}-power`,
      name: `${s.label}: power`,
      colour: runColour(indexOf(s.id)),
      dashed: false,
      axis: "left" as const,
      points: s.curve.points.map((pt) => ({ rpm: pt.rpm, value: p(pt.correctedPowerKw) })),
    },
    {
      key: `${s.id}-torque`,
      name: `${s.label}: torque`,
      colour: runColour(indexOf(s.id)),
      dashed: true,
      axis: "right" as const,
      points: s.curve.points.map((pt) => ({ rpm: pt.rpm, value: t(pt.correctedTorqueNm) })),
    },
    ...(channelShown && s.series[channelShown]?.length
      ? [
          {
            key: `${s.id}-${channelShown}`,
            name: `${s.label}: ${CHANNELS[channelShown].label.toLowerCase()}`,
            colour: runColour(indexOf(s.id)),
            dashed: true,
            axis: "channel" as const,
            points: s.series[channelShown]!,
          },
        ]
      : []),
  ]);
  const marks = shown.flatMap((s) =>
    marksOfRun(s, limits).map((m) => {
      const at = s.curve.points.find((pt) => pt.rpm === m.rpm);
      return { ...m, run: s.label, power: at ? p(at.correctedPowerKw) : 0, key: `${s.id}-${m.kind}-${m.rpm}` };
    }),
  );
  const chartMarks: ChartMark[] = marks.map((m) => ({ key: m.key, rpm: m.rpm, value: m.power, kind: m.kind }));
  const legend: ExportLegendItem[] = series.map((s) => ({ label: s.name, colour: s.colour, dashed: s.dashed }));
  const correctionWords =
    correctedTo === "as-measured" ? AS_MEASURED_LABEL : `corrected to ${POWER_CORRECTION_STANDARDS[correctedTo].label}`;
  const title = `${bikeName}: power (${powerUnit}) and torque (${torqueUnit}), ${correctionWords}`;
  const comparison = shown.length >= 2 ? compareAtSameRpm(shown[0], shown[shown.length - 1], 250) : null;

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
            <div className="flex flex-wrap gap-4">
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
            <label className="flex flex-col gap-1 text-base font-bold">
              Every run corrected to
              <select
                value={correctedTo}
                onChange={(e) => {
                  const v = e.currentTarget.value;
                  setCorrectedTo(v === "as-measured" ? v : (POWER_CORRECTION_STANDARD_IDS.find((s) => s === v) ?? correctedTo));
                }}
                className={selectClass}
                data-testid="correct-to"
              >
                {POWER_CORRECTION_STANDARD_IDS.map((s) => (
                  <option key={s} value={s}>
                    {POWER_CORRECTION_STANDARDS[s].label}
                  </option>
                ))}
                <option value="as-measured">As measured (no correction)</option>
              </select>
            </label>
            <label className="flex flex-col gap-1 text-base font-bold">
              Logged channel on its own scale
              <select
                value={channelShown ?? "none"}
                onChange={(e) => {
                  const v = e.currentTarget.value;
                  setChannel(CHANNEL_IDS.find((c) => c === v) ?? "none");
                }}
                className={selectClass}
                data-testid="channel-axis"
              >
                <option value="none">None</option>
                {loggedChannels.map((c) => (
                  <option key={c} value={c}>
                    {channelAxisLabel(c)}
                  </option>
                ))}
              </select>
            </label>
          </div>
          {(loggedChannels.includes("mixture") || loggedChannels.includes("boost")) && (
            <div className="flex flex-wrap items-end gap-6" data-testid="mark-limits">
              <label className="flex flex-col gap-1 text-base font-bold">
                Mark lean above λ
                <input
                  value={leanText}
                  onChange={(e) => setLeanText(e.currentTarget.value)}
                  inputMode="decimal"
                  className={`${selectClass} w-32 font-mono`}
                />
              </label>
              <label className="flex flex-col gap-1 text-base font-bold">
                Mark over-boost more than (kPa over the target)
                <input
                  value={marginText}
                  onChange={(e) => setMarginText(e.currentTarget.value)}
                  inputMode="decimal"
                  className={`${selectClass} w-32 font-mono`}
                />
              </label>
              <p className="max-w-md text-base">
                Limits to start from: λ 0.85 and 7 kPa (about 1 psi) — common practice for a boosted petrol engine at full load, no source.
                The tune and the fuel decide.
              </p>
            </div>
          )}

          {shown.length === 0 ? (
            <p className="text-lg">Choose at least one run to plot.</p>
          ) : (
            <section aria-label="Power and torque plot" className="flex flex-col gap-3">
              <p className="text-lg">
                <strong>{title}.</strong> Solid lines: power (left scale). Dashed lines: torque (right scale).
                {channelShown && <> Dotted lines: {channelAxisLabel(channelShown).toLowerCase()} (outer right scale).</>}
                {chartMarks.length > 0 && (
                  <>
                    {" "}
                    Marks on the power curve: <span style={{ color: MARK_COLOURS.lean }}>▼</span> lean,{" "}
                    <span style={{ color: MARK_COLOURS["over-boost"] }}>■</span> over-boost.
                  </>
                )}
              </p>
              <CurveChart
                ref={chartRef}
                series={series}
                leftLabel={`Power (${powerUnit})`}
                rightLabel={`Torque (${torqueUnit})`}
                channelLabel={channelShown ? channelAxisLabel(channelShown) : undefined}
                marks={chartMarks}
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
              {marks.length > 0 && (
                <div className="rounded-lg border-4 border-fail bg-fail-light p-3" data-testid="marked-points">
                  <p className="text-lg font-bold text-fail">
                    ⚠ {marks.length} marked point{marks.length === 1 ? "" : "s"}:
                  </p>
                  <ul className="mt-1 flex flex-col gap-1 text-lg">
                    {marks.slice(0, 20).map((m) => (
                      <li key={m.key}>
                        <span aria-hidden="true" style={{ color: MARK_COLOURS[m.kind] }}>
                          {m.kind === "lean" ? "▼ " : "■ "}
                        </span>
                        {m.run}: {m.message}
                      </li>
                    ))}
                    {marks.length > 20 && <li>… and {marks.length - 20} more.</li>}
                  </ul>
                </div>
              )}
              <div className="flex flex-wrap gap-4">
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

          {comparison && (
            <ComparisonSection
              base={shown[0]}
              other={shown[shown.length - 1]}
              comparison={comparison}
              powerUnit={powerUnit}
              torqueUnit={torqueUnit}
            />
          )}
        </>
      )}
      <RunForm workOrderId={workOrderId} tunes={tunes} mappings={mappings} />
    </div>
  );
}
