import type { SheetField } from "@/lib/build-figures/build-sheet";

// The turbo planner's starting figures and field groups: plain data, read by the engine numbers
// page, a job's numbers page (server side) and the planner itself.

export type SheetForm = Partial<Record<SheetField, string>>;

/** Figures a planner starts from when nothing is saved: an invented 1 000 cc four on 100 kPa boost. */
export const PLANNER_START: SheetForm = {
  displacementCc: "998",
  rpmFrom: "4000",
  rpmTo: "11000",
  rpmStep: "1000",
  volumetricEfficiencyPercent: "95",
  boostKpa: "70",
  stationPressureKpa: "101.3",
  ambientC: "25",
  filterLossKpa: "2",
  intercoolerDropKpa: "7",
  pipingDropKpa: "3",
  compressorEfficiencyPercent: "72",
  intercoolerEffectivenessPercent: "70",
  powerKw: "190",
  bsfcGPerKwh: "380",
  injectors: "4",
  maxDutyPercent: "80",
  injectorRatedFlowCcMin: "440",
  injectorRatedPressureKpa: "300",
  baseFuelPressureKpa: "300",
  regulatorRiseRatio: "1",
  pumpMarginPercent: "25",
  boreMm: "76",
  strokeMm: "55",
  rodLengthMm: "110",
  targetCompressionRatio: "9.5",
  intakeClosesDegAbdc: "45",
  deckClearanceMm: "0.2",
  gasketThicknessMm: "0.7",
};

/** Fields that belong to the build's own targets (job page only), shown with the save button. */
export const TARGET_FIELDS: SheetField[] = [
  "targetCompressionRatio",
  "chamberCc",
  "pistonDishCc",
  "gasketBoreMm",
  "boreMm",
  "strokeMm",
  "gasketThicknessMm",
  "deckClearanceMm",
  "rodLengthMm",
  "intakeClosesDegAbdc",
];
export const AIR_FIELDS: SheetField[] = [
  "displacementCc",
  "rpmFrom",
  "rpmTo",
  "rpmStep",
  "volumetricEfficiencyPercent",
  "boostKpa",
  "stationPressureKpa",
  "ambientC",
  "filterLossKpa",
  "intercoolerDropKpa",
  "pipingDropKpa",
  "compressorEfficiencyPercent",
  "intercoolerEffectivenessPercent",
];
export const FUEL_FIELDS: SheetField[] = [
  "powerKw",
  "bsfcGPerKwh",
  "injectors",
  "maxDutyPercent",
  "injectorRatedFlowCcMin",
  "injectorRatedPressureKpa",
  "baseFuelPressureKpa",
  "regulatorRiseRatio",
  "pumpMarginPercent",
];
/** The engine's own geometry: never an invented starting figure on a job's page. */
export const CRANK_FIELDS: SheetField[] = [
  "boreMm",
  "strokeMm",
  "rodLengthMm",
  "targetCompressionRatio",
  "intakeClosesDegAbdc",
  "deckClearanceMm",
  "gasketThicknessMm",
];

/** A sheet's figures as form text. */
export function formOf(figures: Partial<Record<SheetField, number>>): SheetForm {
  const out: SheetForm = {};
  for (const [k, v] of Object.entries(figures) as Array<[SheetField, number]>) out[k] = String(Number(v.toPrecision(10)));
  return out;
}
