/**
 * Slider-crank geometry: piston position against crank angle, dynamic compression ratio from
 * intake-valve closing (and its boosted form), mean piston speed, rod ratio, squish clearance.
 * Lengths in mm.
 */
import { CalcInputError, requireObject } from "./errors";
import { INPUT_RULES } from "./input-rules";
import { requireQuantity, withUnit } from "./quantity";
import { boostedCompressionRatio } from "./compression";
import { STANDARD_ATMOSPHERE_KPA } from "./units";

/** Checks stroke and rod length together: the rod must be at least as long as the stroke. */
function strokeAndRod(strokeMm: unknown, rodLengthMm: unknown): { stroke: number; rod: number } {
  const stroke = requireQuantity(INPUT_RULES.stroke, strokeMm, "strokeMm");
  const rod = requireQuantity(INPUT_RULES.rodLength, rodLengthMm, "rodLengthMm");
  if (!(rod >= stroke)) {
    throw new CalcInputError(INPUT_RULES.rodLength.label, rod, `must be at least the stroke (${withUnit(stroke, "mm")})`, {
      shown: `${withUnit(rod, "mm")}.`,
      field: "rodLengthMm",
    });
  }
  return { stroke, rod };
}

export interface PistonPositionInput {
  strokeMm: number;
  /** Centre-to-centre rod length, mm (at least the stroke). */
  rodLengthMm: number;
  /** Crank angle from top dead centre, degrees (−720 to 720). */
  crankAngleDeg: number;
}

function distanceFromTdc(stroke: number, rod: number, thetaDeg: number): number {
  const a = stroke / 2;
  const th = (thetaDeg * Math.PI) / 180;
  const s = a * Math.cos(th) + Math.sqrt(rod * rod - a * a * Math.sin(th) ** 2);
  return rod + a - s;
}

/**
 * Piston distance below its top-dead-centre position, mm (Heywood, *Internal Combustion Engine
 * Fundamentals*, eq. 2.5, slider-crank with a crank radius a = stroke/2 and rod l):
 *   s = a·cos θ + √(l² − a²·sin² θ),  distance from TDC = l + a − s.
 */
export function pistonPositionFromTdcMm(input: PistonPositionInput): number {
  requireObject("input", input);
  const { stroke, rod } = strokeAndRod(input.strokeMm, input.rodLengthMm);
  const theta = requireQuantity({ label: "Crank angle", unit: "°", min: -720, max: 720 }, input.crankAngleDeg, "crankAngleDeg");
  return distanceFromTdc(stroke, rod, theta);
}

export interface DynamicCompressionInput {
  boreMm: number;
  strokeMm: number;
  /** Centre-to-centre rod length, mm (at least the stroke). */
  rodLengthMm: number;
  /** Static (geometric) compression ratio, e.g. 9.5. */
  staticCompressionRatio: number;
  /**
   * Intake valve closing, crank degrees after bottom dead centre (negative if it closes before).
   * Use the cam card's figure at the lift the card states; the result depends on which (seat-to-seat
   * or at 0.050 in / 1 mm lift) — say which beside the result.
   */
  intakeClosesDegAbdc: number;
}

/**
 * Dynamic compression ratio: the compression that starts when the intake valve closes.
 *   Vs = π/4·bore²·stroke, Vc = Vs / (CR − 1),
 *   x = piston distance from TDC at θ = 180° + IVC (Heywood eq. 2.5, see {@link pistonPositionFromTdcMm}),
 *   DCR = (Vc + π/4·bore²·x) / Vc.
 */
export function dynamicCompressionRatio(input: DynamicCompressionInput): number {
  requireObject("input", input);
  const bore = requireQuantity(INPUT_RULES.bore, input.boreMm, "boreMm");
  const { stroke, rod } = strokeAndRod(input.strokeMm, input.rodLengthMm);
  const cr = requireQuantity(INPUT_RULES.staticCompressionRatio, input.staticCompressionRatio, "staticCompressionRatio");
  const ivc = requireQuantity(INPUT_RULES.intakeClosesAbdc, input.intakeClosesDegAbdc, "intakeClosesDegAbdc");
  const area = (Math.PI / 4) * bore * bore;
  const clearance = (area * stroke) / (cr - 1);
  return (clearance + area * distanceFromTdc(stroke, rod, 180 + ivc)) / clearance;
}

export interface BoostedDynamicCompressionInput extends DynamicCompressionInput {
  /** Gauge boost, kPa (0–600). */
  boostKpa: number;
  /** Air pressure at the engine, kPa absolute; default 101.325 (ISO 2533 sea level). */
  stationPressureKpa?: number;
}

/**
 * Dynamic compression ratio and its boosted ("effective") form, common practice — a rule of thumb
 * for comparing builds, not a thermodynamic result:
 *   boosted = DCR × (station + boost) / station
 * (the same rule the trade applies to static CR as CR·(1 + psi/14.7)).
 */
export function boostedDynamicCompressionRatio(input: BoostedDynamicCompressionInput): {
  dynamicRatio: number;
  boostedRatio: number;
} {
  requireObject("input", input);
  const dynamicRatio = dynamicCompressionRatio(input);
  const boost = requireQuantity(INPUT_RULES.boost, input.boostKpa, "boostKpa");
  const station = requireQuantity(INPUT_RULES.stationPressure, input.stationPressureKpa ?? STANDARD_ATMOSPHERE_KPA, "stationPressureKpa");
  return { dynamicRatio, boostedRatio: boostedCompressionRatio(dynamicRatio, boost, station) };
}

/** Mean piston speed, m/s (Heywood ch. 2): S̄p = 2 · L · N / 60, L stroke in m, N in rpm. */
export function meanPistonSpeedMS(strokeMm: number, rpm: number): number {
  const stroke = requireQuantity(INPUT_RULES.stroke, strokeMm, "strokeMm");
  return (2 * (stroke / 1000) * requireQuantity(INPUT_RULES.engineSpeed, rpm, "rpm")) / 60;
}

/**
 * Rod ratio as the trade quotes it: rod length (centre to centre) / stroke, e.g. 1.75.
 * (Heywood's R = l / a uses the crank radius a = stroke / 2, so R = 2 × this.)
 */
export function rodRatio(rodLengthMm: number, strokeMm: number): number {
  const { stroke, rod } = strokeAndRod(strokeMm, rodLengthMm);
  return rod / stroke;
}

export interface SquishInput {
  /**
   * Piston to block deck at TDC, measured at the squish band, mm: positive when the crown is below
   * the deck, negative when it stands proud (the same sign as the compression sheet's deck clearance).
   */
  deckClearanceMm: number;
  /** Head gasket thickness as compressed (the maker's compressed figure), mm. */
  compressedGasketMm: number;
}

/**
 * Squish (quench) clearance at TDC, mm: the gap between the piston's squish band and the head's
 * squish face with a flat-decked head:
 *   squish = compressed gasket + piston-to-deck   (piston-to-deck negative when the piston is proud).
 * Rod stretch and bearing clearance at speed take some of it; check with solder or clay at assembly.
 * Throws when the gap comes out at 0 or less (the piston would hit the head).
 */
export function squishClearanceMm(input: SquishInput): number {
  requireObject("input", input);
  const deck = requireQuantity(INPUT_RULES.deckClearance, input.deckClearanceMm, "deckClearanceMm");
  const gasket = requireQuantity(INPUT_RULES.compressedGasket, input.compressedGasketMm, "compressedGasketMm");
  const squish = gasket + deck;
  if (!(squish > 0)) {
    throw new CalcInputError(
      "Squish clearance",
      squish,
      `must be more than 0 mm: the piston would hit the head (gasket ${withUnit(gasket, "mm")}, piston to deck ${withUnit(deck, "mm")})`,
      { shown: `${withUnit(Number(squish.toFixed(3)), "mm")}.`, field: "deckClearanceMm" },
    );
  }
  return squish;
}
