/**
 * Bearing oil clearance from micrometer (journal) and bore-gauge (assembled bearing bore) readings.
 * Results are in the readings' unit (use one unit for both arrays).
 */
import { CalcInputError, requirePositive } from "./errors";

export interface OilClearanceResult {
  /** bore[i] − journal[i] for each bearing, in input order. Negative means interference. */
  each: number[];
  min: number;
  max: number;
}

/**
 * Oil clearance per bearing: clearance[i] = bearingBores[i] − journalDiameters[i].
 * Both arrays must be non-empty, the same length, and hold finite readings > 0.
 * A negative clearance (bore smaller than journal) is returned as measured, not thrown, so the
 * sheet can show it; a tolerance check then reports it as low.
 */
export function oilClearance(journalDiameters: number[], bearingBores: number[]): OilClearanceResult {
  if (!Array.isArray(journalDiameters) || journalDiameters.length === 0) {
    throw new CalcInputError("journalDiameters", journalDiameters, "must be a non-empty array of readings");
  }
  if (!Array.isArray(bearingBores) || bearingBores.length !== journalDiameters.length) {
    throw new CalcInputError("bearingBores", bearingBores, `must be an array with one reading per journal (${journalDiameters.length})`);
  }
  const each = journalDiameters.map((journal, i) => {
    requirePositive(`journalDiameters[${i}]`, journal);
    return requirePositive(`bearingBores[${i}]`, bearingBores[i]) - journal;
  });
  return { each, min: Math.min(...each), max: Math.max(...each) };
}

/**
 * Rule-of-thumb bearing oil clearance: 0.001 × journal diameter (0.001 in per inch of journal),
 * in the journal's unit. Common practice only — the engine maker's figure always governs.
 */
export function oilClearanceGuide(journalDiameter: number): { clearance: number; basis: string; caution: string } {
  requirePositive("journalDiameter", journalDiameter);
  return {
    clearance: 0.001 * journalDiameter,
    basis: "Common practice: about 0.001 per unit of journal diameter (0.001 in per inch).",
    caution: "A rule of thumb, not a specification: use the engine or bearing maker's clearance.",
  };
}
