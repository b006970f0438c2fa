/**
 * One dyno run: observed and corrected torque and power at every recorded engine speed, and the
 * peaks. Corrected = observed × the chosen standard's correction factor (lib/calc), which is the
 * same for torque and power because it depends only on the air at the intake.
 */
import { CalcInputError, powerCorrectionFactor, powerKw, vaporPressureKpa, type PowerCorrectionStandard } from "@/lib/calc";
import { requireFinite, requirePositive } from "@/lib/calc/errors";

/** One recorded point of a run: engine speed (rev/min) and torque (N·m). */
interface CurvePoint {
  rpm: number;
  torqueNm: number;
}

/** The air in the dyno cell during the run and the standard chosen to correct to. */
interface RunConditions {
  /** Observed (total) barometric pressure, kPa. */
  pressureKpa: number;
  /** Intake air temperature, °C. */
  temperatureC: number;
  /** Relative humidity, % (0–100). */
  humidityPercent: number;
  /** The standard to correct to, or "as-measured" for no correction (factor 1). */
  standard: CorrectionChoice;
}

/** A correction standard, or no correction at all ("as-measured": corrected values equal the observed ones). */
export type CorrectionChoice = PowerCorrectionStandard | "as-measured";

interface ComputedPoint {
  rpm: number;
  observedTorqueNm: number;
  observedPowerKw: number;
  correctedTorqueNm: number;
  correctedPowerKw: number;
}

/** A value and the engine speed where it occurs. */
export interface Peak {
  value: number;
  rpm: number;
}

export interface RunCurve {
  /** The correction factor applied to every point. */
  factor: number;
  /** Water-vapour partial pressure used for the dry-air pressure, kPa. */
  vaporPressureKpa: number;
  points: ComputedPoint[];
  peaks: {
    observedPowerKw: Peak;
    correctedPowerKw: Peak;
    observedTorqueNm: Peak;
    correctedTorqueNm: Peak;
  };
}

/** The highest value of `pick` over `points`, with its rpm (the lowest rpm wins a tie). */
export function peakOf<T extends { rpm: number }>(points: readonly T[], pick: (p: T) => number): Peak {
  if (points.length === 0) throw new CalcInputError("points", points, "must hold at least one point");
  let best: Peak = { value: pick(points[0]), rpm: points[0].rpm };
  for (const p of points.slice(1)) {
    const v = pick(p);
    if (v > best.value) best = { value: v, rpm: p.rpm };
  }
  return best;
}

/** Throws unless rpm values are finite, > 0 and strictly increasing. */
function requireRisingRpm(points: readonly { rpm: number }[]): void {
  points.forEach((p, i) => {
    requirePositive(`points[${i}].rpm`, p.rpm);
    if (i > 0 && !(p.rpm > points[i - 1].rpm)) {
      throw new CalcInputError(`points[${i}].rpm`, p.rpm, `must be above the previous point's rpm (${points[i - 1].rpm})`);
    }
  });
}

/**
 * Computes a run's curve. Points must be in rising rpm order (at least two).
 * P[kW] = T[N·m] · rpm · 2π / 60 000 (powerKw); corrected values = observed × factor, with the
 * factor from `powerCorrectionFactor(standard, { pressure, temperature, vapour pressure })` and the
 * vapour pressure from temperature and relative humidity (Buck equation, vaporPressureKpa).
 */
export function computeRunCurve(points: readonly CurvePoint[], conditions: RunConditions): RunCurve {
  if (points.length < 2) throw new CalcInputError("points", points.length, "must hold at least two points");
  requireRisingRpm(points);
  const vapour = vaporPressureKpa(conditions.temperatureC, conditions.humidityPercent);
  const factor =
    conditions.standard === "as-measured"
      ? 1
      : powerCorrectionFactor(conditions.standard, {
          pressureKpa: conditions.pressureKpa,
          temperatureC: conditions.temperatureC,
          vaporPressureKpa: vapour,
        });
  const computed = points.map((p, i) => {
    const torque = requireFinite(`points[${i}].torqueNm`, p.torqueNm);
    const observedPowerKw = powerKw(torque, p.rpm);
    return {
      rpm: p.rpm,
      observedTorqueNm: torque,
      observedPowerKw,
      correctedTorqueNm: torque * factor,
      correctedPowerKw: observedPowerKw * factor,
    };
  });
  return {
    factor,
    vaporPressureKpa: vapour,
    points: computed,
    peaks: {
      observedPowerKw: peakOf(computed, (p) => p.observedPowerKw),
      correctedPowerKw: peakOf(computed, (p) => p.correctedPowerKw),
      observedTorqueNm: peakOf(computed, (p) => p.observedTorqueNm),
      correctedTorqueNm: peakOf(computed, (p) => p.correctedTorqueNm),
    },
  };
}
