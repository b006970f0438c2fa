/**
 * A stored run as the pages and the report use it: its facts, its curve computed, and its figures
 * (peaks, power per unit of boost).
 */
import { convertPressure, convertTorque, POWER_CORRECTION_STANDARDS, type PowerCorrectionStandard } from "@/lib/calc";
import { powerPerBoost } from "./boost";
import type { CurveTorqueUnit } from "./curve-rows";
import type { BoostUnit } from "./run-input";
import type { DynoRunWithdrawal } from "./run-withdrawal";
import { computeRunCurve, type RunCurve } from "./run-curve";

export interface StoredDynoRun {
  id: string;
  label: string;
  ranOn: string;
  boostTarget: number;
  boostUnit: BoostUnit;
  pressureKpa: number;
  temperatureC: number;
  humidityPercent: number;
  standard: PowerCorrectionStandard;
  torqueUnit: CurveTorqueUnit;
  notes: string;
  /** Torque in `torqueUnit`, as recorded. */
  points: Array<{ rpm: number; torque: number }>;
  /** Set when the run was withdrawn (see ./run-withdrawal.ts); it then counts nowhere. */
  withdrawn: DynoRunWithdrawal | null;
}

export interface DynoRunSummary extends StoredDynoRun {
  standardLabel: string;
  curve: RunCurve;
  /** Peak corrected power per psi and per bar of boost target; null without boost. */
  kwPerPsi: number | null;
  kwPerBar: number | null;
  boostPsi: number;
}

export function summariseRun(run: StoredDynoRun): DynoRunSummary {
  const curve = computeRunCurve(
    run.points.map((p) => ({ rpm: p.rpm, torqueNm: convertTorque(p.torque, run.torqueUnit, "N·m") })),
    { pressureKpa: run.pressureKpa, temperatureC: run.temperatureC, humidityPercent: run.humidityPercent, standard: run.standard },
  );
  const boost = { value: run.boostTarget, unit: run.boostUnit };
  const peak = curve.peaks.correctedPowerKw.value;
  return {
    ...run,
    standardLabel: POWER_CORRECTION_STANDARDS[run.standard].label,
    curve,
    kwPerPsi: powerPerBoost(peak, boost, "kW", "psi"),
    kwPerBar: powerPerBoost(peak, boost, "kW", "bar"),
    boostPsi: convertPressure(run.boostTarget, run.boostUnit, "psi"),
  };
}
