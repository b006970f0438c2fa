/**
 * A stored run as the pages and the report use it: its facts as recorded, its curve recomputed from
 * the raw torque to the standard asked for (its own, or one chosen to compare runs at), whether the
 * run's air is inside that standard's validity range, and its logged channels in their plotting
 * units (λ, kPa gauge, °C, …).
 */
import {
  convertTorque,
  correctionValidity,
  POWER_CORRECTION_STANDARDS,
  vaporPressureKpa,
  type FuelId,
  type PowerCorrectionStandard,
  type ValidityCheck,
} from "@/lib/calc";
import { boostTargetKpa, type BoostUnit } from "./boost";
import { channelValueInBase, runChannelContext, type ChannelId } from "./channels";
import type { CurveTorqueUnit } from "./curve-rows";
import type { LoggedChannel } from "./logged-csv";
import type { DynoRunWithdrawal } from "./run-withdrawal";
import { computeRunCurve, type CorrectionChoice, type RunCurve } from "./run-curve";

/** The tune a run was made on (./tune-version.ts), as the run names it. */
export interface RunTune {
  id: string;
  label: string;
  sha256: string;
}

export interface StoredDynoRun {
  id: string;
  label: string;
  ranOn: string;
  boostTarget: number;
  boostUnit: BoostUnit;
  /** Air pressure at the dyno (station pressure), kPa. */
  pressureKpa: number;
  temperatureC: number;
  humidityPercent: number;
  /** The standard the run was recorded under. */
  standard: PowerCorrectionStandard;
  torqueUnit: CurveTorqueUnit;
  notes: string;
  /** The fuel the run was made on; null when not named (older runs, runs without a mixture channel). */
  fuel: FuelId | null;
  /** The tune the run was made on; null when the run names none (no tune file of the shop's). */
  tune: RunTune | null;
  /** Channels logged on the run, with their unit and file column; empty when only torque was recorded. */
  channels: LoggedChannel[];
  /** Torque in `torqueUnit`, as recorded; `logged` holds channel values as recorded (only on runs with channels). */
  points: Array<{ rpm: number; torque: number; logged?: Partial<Record<ChannelId, number>> }>;
  /** Set when the run was withdrawn (see ./run-withdrawal.ts); it then counts nowhere. */
  withdrawn: DynoRunWithdrawal | null;
}

export interface DynoRunSummary extends StoredDynoRun {
  /** The standard the curve's corrected values are at ("as-measured": no correction), and its name. */
  correctedTo: CorrectionChoice;
  standardLabel: string;
  curve: RunCurve;
  /** The run's air against the validity range of `correctedTo`; null as measured. */
  validity: ValidityCheck | null;
  boostTargetKpa: number;
  /** Logged channels in their plotting unit, points in rising rpm where logged. */
  series: Partial<Record<ChannelId, Array<{ rpm: number; value: number }>>>;
}

export const AS_MEASURED_LABEL = "as measured (no correction)";

/** Each logged channel of `run` in its plotting unit (λ, kPa gauge, °C, km/h…). */
export function runChannelSeries(run: StoredDynoRun): DynoRunSummary["series"] {
  const ctx = runChannelContext(run.fuel, run.pressureKpa);
  const series: DynoRunSummary["series"] = {};
  for (const c of run.channels) {
    const line: Array<{ rpm: number; value: number }> = [];
    for (const p of run.points) {
      const v = p.logged?.[c.channel];
      if (v === undefined) continue;
      const base = channelValueInBase(c.channel, c.unit, v, ctx);
      if (base !== null) line.push({ rpm: p.rpm, value: base });
    }
    series[c.channel] = line;
  }
  return series;
}

/**
 * The run recomputed from its raw torque: corrected to `standard` (default: the one it was recorded
 * under), so runs recorded under different standards can be compared at one.
 */
export function summariseRun(run: StoredDynoRun, standard: CorrectionChoice = run.standard): DynoRunSummary {
  const conditions = { pressureKpa: run.pressureKpa, temperatureC: run.temperatureC, humidityPercent: run.humidityPercent, standard };
  const curve = computeRunCurve(
    run.points.map((p) => ({ rpm: p.rpm, torqueNm: convertTorque(p.torque, run.torqueUnit, "N·m") })),
    conditions,
  );
  return {
    ...run,
    correctedTo: standard,
    standardLabel: standard === "as-measured" ? AS_MEASURED_LABEL : POWER_CORRECTION_STANDARDS[standard].label,
    curve,
    validity:
      standard === "as-measured"
        ? null
        : correctionValidity(standard, {
            pressureKpa: run.pressureKpa,
            temperatureC: run.temperatureC,
            vaporPressureKpa: vaporPressureKpa(run.temperatureC, run.humidityPercent),
          }),
    boostTargetKpa: boostTargetKpa(run.boostTarget, run.boostUnit),
    series: runChannelSeries(run),
  };
}
