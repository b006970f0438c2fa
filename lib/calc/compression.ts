/**
 * Cylinder volumes and compression ratios.
 *
 * Geometric compression ratio after Heywood, *Internal Combustion Engine
 * Fundamentals*, ch. 2: CR = (Vs + Vc) / Vc, Vs the swept volume, Vc the
 * clearance volume left above the piston at top dead centre.
 */
import { CalcInputError, requireFinite, requireNonNegative, requireObject, requirePositive } from "./errors";
import { STANDARD_ATMOSPHERE_KPA } from "./units";
import { pressureRatioFromBoost } from "./charge-air";

/** Volume in cc (cm³) of a cylinder of diameter `diameterMm` and height `heightMm`: π/4·d²·h / 1000. */
function discVolumeCc(diameterMm: number, heightMm: number): number {
  return ((Math.PI / 4) * diameterMm * diameterMm * heightMm) / 1000;
}

/**
 * Swept volume of one cylinder in cc (cm³).
 * Vs = π/4 · bore² · stroke, bore and stroke in mm, divided by 1000 mm³/cc.
 */
export function sweptVolumeCc(boreMm: number, strokeMm: number): number {
  requirePositive("boreMm", boreMm);
  requirePositive("strokeMm", strokeMm);
  return discVolumeCc(boreMm, strokeMm);
}

/** Inputs for {@link staticCompressionRatio}; lengths in mm, volumes in cc. */
export interface CompressionInput {
  /** Cylinder bore, mm (> 0). */
  boreMm: number;
  /** Stroke, mm (> 0). */
  strokeMm: number;
  /** Combustion chamber volume in the head, cc (≥ 0). */
  chamberCc: number;
  /** Head gasket bore (fire-ring diameter), mm (> 0). */
  gasketBoreMm: number;
  /** Compressed head gasket thickness, mm (≥ 0). */
  gasketThicknessMm: number;
  /** Piston-to-deck distance at TDC, mm: positive when the crown sits below the deck, negative when above. */
  deckClearanceMm: number;
  /** Piston crown volume, cc: positive for a dish or valve reliefs, negative for a dome. */
  pistonDishCc: number;
}

/** Volumes behind a compression ratio, all in cc. */
export interface CompressionVolumes {
  sweptCc: number;
  chamberCc: number;
  /** π/4 · gasketBore² · gasketThickness. */
  gasketCc: number;
  /** π/4 · bore² · deckClearance (negative when the piston rises above the deck). */
  deckCc: number;
  /** Piston dish (+) or dome (−). */
  dishCc: number;
  /** chamber + gasket + deck + dish; always > 0 when returned. */
  clearanceCc: number;
}

/**
 * Breaks a compression calculation down into its volumes (cc).
 * Clearance volume Vc = chamber + π/4·gasketBore²·gasketThickness + π/4·bore²·deckClearance + dish.
 * Throws {@link CalcInputError} when Vc ≤ 0 (the piston would hit the head).
 */
export function compressionVolumes(input: CompressionInput): CompressionVolumes {
  requireObject("input", input);
  const { boreMm, strokeMm, chamberCc, gasketBoreMm, gasketThicknessMm, deckClearanceMm, pistonDishCc } = input;
  const sweptCc = sweptVolumeCc(boreMm, strokeMm);
  requireNonNegative("chamberCc", chamberCc);
  requirePositive("gasketBoreMm", gasketBoreMm);
  requireNonNegative("gasketThicknessMm", gasketThicknessMm);
  requireFinite("deckClearanceMm", deckClearanceMm);
  requireFinite("pistonDishCc", pistonDishCc);
  const gasketCc = discVolumeCc(gasketBoreMm, gasketThicknessMm);
  const deckCc = discVolumeCc(boreMm, deckClearanceMm);
  const clearanceCc = chamberCc + gasketCc + deckCc + pistonDishCc;
  if (!(clearanceCc > 0)) {
    throw new CalcInputError("clearance volume (chamberCc + gasket + deck + pistonDishCc)", clearanceCc, "must be > 0 cc");
  }
  return { sweptCc, chamberCc, gasketCc, deckCc, dishCc: pistonDishCc, clearanceCc };
}

/**
 * Static (geometric) compression ratio, Heywood ch. 2: CR = (Vs + Vc) / Vc.
 * Vs = π/4·bore²·stroke; Vc = chamber + gasket + deck + dish (see {@link compressionVolumes}).
 * Returns the ratio as a plain number (e.g. 10.5 for 10.5:1).
 */
export function staticCompressionRatio(input: CompressionInput): number {
  const v = compressionVolumes(input);
  return (v.sweptCc + v.clearanceCc) / v.clearanceCc;
}

/**
 * "Effective" compression ratio under boost — a common-practice rule of thumb, not a standard
 * and not a thermodynamic result:
 *   CR_eff = staticCr × (ambientKpa + boostKpa) / ambientKpa,
 * i.e. static CR times the absolute manifold pressure ratio (the trade's CR·(1 + psi/14.7)).
 * `boostKpa` is gauge boost (manifold pressure above ambient); `ambientKpa` defaults to
 * 101.325 kPa (ISO 2533 sea level). Another form in use, (CR − 1)·PR + 1, is not implemented.
 */
export function boostedCompressionRatio(staticCr: number, boostKpa: number, ambientKpa: number = STANDARD_ATMOSPHERE_KPA): number {
  requireFinite("staticCr", staticCr);
  if (!(staticCr > 1)) throw new CalcInputError("staticCr", staticCr, "must be > 1");
  return staticCr * pressureRatioFromBoost(boostKpa, ambientKpa);
}
