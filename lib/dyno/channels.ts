/**
 * Logged channels of a dyno run besides engine speed and torque: the mixture (lambda, or the
 * air-fuel ratio with the fuel's stoichiometric ratio), manifold boost, charge pressure before the
 * intercooler, intake air temperature before and after the intercooler, ignition advance, knock
 * retard, road speed and gear. Each channel has the units a logger may write it in, a physical range
 * (in one unit of its own, the one plots and comparisons use) and messages in workshop words that
 * name the unit the file used: "Boost 59 bar is 5 900 kPa; the limit is -100 to 600 kPa."
 * Values are stored as the file gave them; conversion happens when they are read.
 */
import { FUELS, type FuelId } from "@/lib/calc/fuels";
import { formatNumber, withUnit } from "@/lib/calc/quantity";
import { convertPressure, convertTemperature, STANDARD_ATMOSPHERE_KPA } from "@/lib/calc/units";

export const CHANNEL_IDS = [
  "mixture",
  "boost",
  "chargePressure",
  "iatBeforeCooler",
  "iatAfterCooler",
  "ignition",
  "knockRetard",
  "roadSpeed",
  "gear",
] as const;
export type ChannelId = (typeof CHANNEL_IDS)[number];

/** The conditions a channel's values are read in: the run's fuel and its air pressure. */
export interface ChannelContext {
  /** Stoichiometric air-fuel ratio of the run's fuel; null when no fuel is named. */
  stoichiometricAfr: number | null;
  /** Air pressure at the dyno (station pressure), kPa: turns an absolute boost reading into gauge. */
  stationPressureKpa: number;
}

interface ChannelUnit {
  /** The unit as written in a file's mapping, stored and shown. */
  id: string;
  /** Said in a message, e.g. "kPa absolute". */
  words: string;
  /** The value in the channel's own unit; null when the context lacks what it needs. */
  toBase: (value: number, ctx: ChannelContext) => number | null;
}

export interface ChannelDef {
  id: ChannelId;
  /** The name the user sees, e.g. "Manifold boost". */
  label: string;
  /** Units a file may give the channel in. */
  units: readonly ChannelUnit[];
  /** The unit plots and comparisons use. */
  baseUnit: string;
  /** Physical range in `baseUnit` (both ends allowed). */
  min: number;
  max: number;
  /** Only whole numbers (gear). */
  integer?: boolean;
  /** Words after the range, e.g. "as degrees taken off, a positive number". */
  hint?: string;
}

const same: ChannelUnit["toBase"] = (v) => v;
const pressureUnits: ChannelUnit[] = [
  { id: "kPa", words: "kPa (gauge)", toBase: same },
  { id: "psi", words: "psi (gauge)", toBase: (v) => convertPressure(v, "psi", "kPa") },
  { id: "bar", words: "bar (gauge)", toBase: (v) => convertPressure(v, "bar", "kPa") },
  { id: "kPa abs", words: "kPa absolute", toBase: (v, ctx) => v - ctx.stationPressureKpa },
];
const temperatureUnits: ChannelUnit[] = [
  { id: "°C", words: "°C", toBase: same },
  { id: "°F", words: "°F", toBase: (v) => (v < -459.67 ? null : convertTemperature(v, "F", "C")) },
];

/** Every channel: units, range and name. Ranges refuse what cannot be, not what is unusual. */
export const CHANNELS: Readonly<Record<ChannelId, ChannelDef>> = {
  mixture: {
    id: "mixture",
    label: "Mixture",
    units: [
      { id: "λ", words: "lambda", toBase: same },
      { id: "AFR", words: "air-fuel ratio", toBase: (v, ctx) => (ctx.stoichiometricAfr === null ? null : v / ctx.stoichiometricAfr) },
    ],
    baseUnit: "λ",
    min: 0.4,
    max: 3,
  },
  boost: {
    id: "boost",
    label: "Manifold boost",
    units: pressureUnits,
    baseUnit: "kPa",
    min: -100,
    max: 600,
    hint: "gauge; negative for vacuum",
  },
  chargePressure: {
    id: "chargePressure",
    label: "Charge pressure before the intercooler",
    units: pressureUnits,
    baseUnit: "kPa",
    min: -100,
    max: 650,
    hint: "gauge",
  },
  iatBeforeCooler: {
    id: "iatBeforeCooler",
    label: "Intake air before the intercooler",
    units: temperatureUnits,
    baseUnit: "°C",
    min: -40,
    max: 250,
  },
  iatAfterCooler: {
    id: "iatAfterCooler",
    label: "Intake air after the intercooler",
    units: temperatureUnits,
    baseUnit: "°C",
    min: -40,
    max: 200,
  },
  ignition: {
    id: "ignition",
    label: "Ignition advance",
    units: [{ id: "° BTDC", words: "degrees before top dead centre", toBase: same }],
    baseUnit: "° BTDC",
    min: -30,
    max: 70,
  },
  knockRetard: {
    id: "knockRetard",
    label: "Knock retard",
    units: [{ id: "°", words: "degrees taken off", toBase: same }],
    baseUnit: "°",
    min: 0,
    max: 30,
    hint: "degrees taken off, a positive number",
  },
  roadSpeed: {
    id: "roadSpeed",
    label: "Road speed",
    units: [
      { id: "km/h", words: "km/h", toBase: same },
      { id: "mph", words: "mph", toBase: (v) => v * 1.609344 },
    ],
    baseUnit: "km/h",
    min: 0,
    max: 500,
  },
  gear: {
    id: "gear",
    label: "Gear",
    units: [{ id: "gear", words: "gear number", toBase: same }],
    baseUnit: "",
    min: 0,
    max: 8,
    integer: true,
    hint: "0 for neutral",
  },
};

/** The unit ids a channel may be given in, e.g. ["kPa", "psi", "bar", "kPa abs"]. */
export function channelUnitIds(channel: ChannelId): string[] {
  return CHANNELS[channel].units.map((u) => u.id);
}

function unitOf(channel: ChannelId, unit: string): ChannelUnit | undefined {
  return CHANNELS[channel].units.find((u) => u.id === unit);
}

/** The channel's value in its own unit (λ, kPa gauge, °C, …), or null when it cannot be read (AFR without a fuel). */
export function channelValueInBase(channel: ChannelId, unit: string, value: number, ctx: ChannelContext): number | null {
  const u = unitOf(channel, unit);
  return u ? u.toBase(value, ctx) : null;
}

const num = (x: number) => formatNumber(Number(x.toFixed(3)));
function rangeWords(def: ChannelDef): string {
  const span = `${num(def.min)} to ${def.baseUnit ? withUnit(def.max, def.baseUnit) : num(def.max)}`;
  return def.baseUnit === "λ" ? `λ ${num(def.min)} to ${num(def.max)}` : span;
}

/**
 * Why `value` (in `unit`) cannot be a reading of `channel`, in workshop words, or null when it can.
 * Out of range in another unit than the channel's own, the message gives both:
 * "Manifold boost 59 bar is 5 900 kPa; the limit is -100 to 600 kPa (gauge; negative for vacuum)."
 */
export function channelValueProblem(channel: ChannelId, unit: string, value: number, ctx: ChannelContext): string | null {
  const def = CHANNELS[channel];
  const u = unitOf(channel, unit);
  if (!u) return `${def.label}: the unit ${JSON.stringify(unit)} is not one of ${channelUnitIds(channel).join(", ")}.`;
  if (!Number.isFinite(value)) return `${def.label} must be a number.`;
  if (def.integer && !Number.isInteger(value)) return `${def.label} must be a whole number; got ${formatNumber(value)}.`;
  const base = u.toBase(value, ctx);
  if (base === null) {
    return channel === "mixture"
      ? `${def.label} is an air-fuel ratio: name the fuel of the run so it can be read as lambda.`
      : `${def.label} ${formatNumber(value)} ${u.id} is below absolute zero.`;
  }
  if (base >= def.min && base <= def.max) return null;
  const hint = def.hint ? ` (${def.hint})` : "";
  if (u.id === def.baseUnit) {
    const got = def.baseUnit === "λ" ? `λ ${formatNumber(value)}` : def.baseUnit ? withUnit(value, u.id) : formatNumber(value);
    return `${def.label} must be from ${rangeWords(def)}${hint}; got ${got}.`;
  }
  const asBase = def.baseUnit === "λ" ? `λ ${num(base)}` : withUnit(Number(base.toFixed(2)), def.baseUnit);
  const fuel = channel === "mixture" && ctx.stoichiometricAfr !== null ? ` (stoichiometric ${num(ctx.stoichiometricAfr)})` : "";
  return `${def.label} ${formatNumber(value)} ${u.id}${fuel} is ${asBase}; the limit is ${rangeWords(def)}${hint}.`;
}

/** The context of a run: its fuel's stoichiometric ratio and its air pressure. */
export function runChannelContext(fuel: FuelId | null, stationPressureKpa: number | null): ChannelContext {
  return {
    stoichiometricAfr: fuel === null ? null : FUELS[fuel].stoichiometricAfr,
    stationPressureKpa: stationPressureKpa !== null && Number.isFinite(stationPressureKpa) ? stationPressureKpa : STANDARD_ATMOSPHERE_KPA,
  };
}
