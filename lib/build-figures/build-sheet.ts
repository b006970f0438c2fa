/**
 * A work order's build sheet: the targets (compression ratio, planned boost, power) and the figures
 * that come from parts makers' sheets rather than the bench (piston dish, rod length, intake closing
 * from the cam card, injector rating), the turbo and fuel plan, and the compressor map outline the
 * user copied from the maker's sheet (Benchtag ships none). Each save is a new row (table
 * build_sheets); the newest is current.
 *
 * Every figure has the unit the form shows, a physical range and an error in workshop words: the
 * rules below are the form's labels and the server's check at once.
 */
import {
  CalcInputError,
  checkCompressorMapOutline,
  FUEL_IDS,
  INPUT_RULES,
  KELVIN_AT_0_C,
  quantityError,
  isInRange,
  relabel,
  requireChoice,
  type CheckedMapOutline,
  type CompressorMapOutline,
  type FuelId,
  type QuantityRule,
} from "@/lib/calc";
import type { FieldIssue } from "@/lib/errors";

/** A fraction rule shown as a percentage. */
function percent(rule: QuantityRule, label = rule.label): QuantityRule {
  return { label, unit: "%", min: rule.min * 100, max: rule.max * 100, minExclusive: rule.minExclusive, maxExclusive: rule.maxExclusive };
}

/** A kelvin rule shown in °C. */
function celsius(rule: QuantityRule, label = rule.label): QuantityRule {
  const c = (k: number) => Number((k - KELVIN_AT_0_C).toFixed(2));
  return { label, unit: "°C", min: c(rule.min), max: c(rule.max) };
}

const R = INPUT_RULES;

/** The build sheet's number fields: label, unit and range each. */
export const SHEET_FIELDS = Object.freeze({
  // targets and parts makers' figures (item: the build's own figures)
  targetCompressionRatio: relabel(R.staticCompressionRatio, "Target compression ratio"),
  boreMm: relabel(R.bore, "Bore (when not measured)"),
  strokeMm: relabel(R.stroke, "Stroke (crank maker's figure)"),
  chamberCc: relabel(R.chamberVolume, "Chamber volume (when not measured)"),
  pistonDishCc: R.pistonDish,
  gasketBoreMm: R.gasketBore,
  gasketThicknessMm: relabel(R.compressedGasket, "Compressed gasket thickness (when not measured)"),
  deckClearanceMm: relabel(R.deckClearance, "Piston to deck at TDC (when not measured)"),
  rodLengthMm: R.rodLength,
  intakeClosesDegAbdc: relabel(R.intakeClosesAbdc, "Intake valve closing (cam card)"),
  // turbo plan
  displacementCc: R.displacement,
  rpmFrom: relabel(R.engineSpeed, "Rev range from"),
  rpmTo: relabel(R.engineSpeed, "Rev range to"),
  rpmStep: { label: "Rev range step", unit: "rpm", min: 100, max: 5000 },
  volumetricEfficiencyPercent: percent(R.volumetricEfficiency),
  boostKpa: relabel(R.boost, "Planned boost (gauge)"),
  stationPressureKpa: R.stationPressure,
  ambientC: celsius(R.ambientTemperature),
  filterLossKpa: R.filterLoss,
  intercoolerDropKpa: R.intercoolerDrop,
  pipingDropKpa: R.pipingDrop,
  compressorEfficiencyPercent: percent(R.compressorEfficiency),
  intercoolerEffectivenessPercent: percent(R.intercoolerEffectiveness),
  // fuel plan
  powerKw: R.power,
  bsfcGPerKwh: R.bsfc,
  injectors: R.injectors,
  maxDutyPercent: percent(R.maxDuty),
  injectorRatedFlowCcMin: relabel(R.injectorFlow, "Injector rated flow"),
  injectorRatedPressureKpa: R.ratedFuelPressure,
  baseFuelPressureKpa: R.baseFuelPressure,
  regulatorRiseRatio: R.regulatorRiseRatio,
  pumpMarginPercent: percent(R.pumpMargin),
} satisfies Record<string, QuantityRule>);

export type SheetField = keyof typeof SHEET_FIELDS;
export const SHEET_FIELD_KEYS = Object.keys(SHEET_FIELDS) as SheetField[];

export interface BuildSheet {
  figures: Partial<Record<SheetField, number>>;
  fuel: FuelId | null;
  mapOutline: CheckedMapOutline | null;
}

export const EMPTY_BUILD_SHEET: BuildSheet = Object.freeze({ figures: {}, fuel: null, mapOutline: null });

/**
 * Checks a build sheet as sent: every figure a finite number in its range (blank figures are
 * left out), the fuel one of ours, the map outline by {@link checkCompressorMapOutline}.
 * Every problem is reported at once, each naming the field as the form shows it.
 */
export function checkBuildSheet(raw: unknown): { ok: true; sheet: BuildSheet } | { ok: false; issues: FieldIssue[] } {
  const issues: FieldIssue[] = [];
  const body = (typeof raw === "object" && raw !== null && !Array.isArray(raw) ? raw : {}) as Record<string, unknown>;
  const inFigures = (typeof body.figures === "object" && body.figures !== null ? body.figures : {}) as Record<string, unknown>;
  const figures: BuildSheet["figures"] = {};
  for (const key of Object.keys(inFigures)) {
    if (!(SHEET_FIELD_KEYS as string[]).includes(key))
      issues.push({ path: `figures.${key.slice(0, 40)}`, message: "Not a build sheet figure." });
  }
  for (const key of SHEET_FIELD_KEYS) {
    const v = inFigures[key];
    if (v === undefined || v === null) continue;
    if (isInRange(SHEET_FIELDS[key], v)) figures[key] = v;
    else issues.push({ path: `figures.${key}`, message: quantityError(SHEET_FIELDS[key], v).message });
  }
  if (figures.rpmFrom !== undefined && figures.rpmTo !== undefined && !(figures.rpmTo > figures.rpmFrom)) {
    issues.push({
      path: "figures.rpmTo",
      message: `Rev range to must be above rev range from (${figures.rpmFrom} rpm); got ${figures.rpmTo} rpm.`,
    });
  }
  let fuel: FuelId | null = null;
  if (body.fuel !== undefined && body.fuel !== null) {
    try {
      fuel = requireChoice("Fuel", body.fuel, FUEL_IDS, "fuel");
    } catch (e) {
      issues.push({ path: "fuel", message: (e as Error).message });
    }
  }
  let mapOutline: CheckedMapOutline | null = null;
  if (body.mapOutline !== undefined && body.mapOutline !== null) {
    try {
      mapOutline = checkCompressorMapOutline(body.mapOutline as CompressorMapOutline);
    } catch (e) {
      if (!(e instanceof CalcInputError)) throw e;
      issues.push({ path: `mapOutline.${e.field}`, message: e.message });
    }
  }
  return issues.length ? { ok: false, issues } : { ok: true, sheet: { figures, fuel, mapOutline } };
}

/** A stored sheet read back (checked again; a row that no longer passes reads as empty). */
export function readStoredSheet(stored: unknown): BuildSheet {
  const r = checkBuildSheet(stored);
  return r.ok ? r.sheet : EMPTY_BUILD_SHEET;
}
