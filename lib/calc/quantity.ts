/**
 * Checking a number the user entered against the physical range of what it measures, with the
 * error in workshop words: the name the user sees, the unit, the range and what was entered, e.g.
 *   "Engine speed must be between 1 and 25 000 rpm; got -5 rpm."
 * The ranges themselves are data in `input-rules.ts`.
 */
import { CalcInputError } from "./errors";
import { KELVIN_AT_0_C } from "./units";

/** What a number means and the range it may take. */
export interface QuantityRule {
  /** The name the user sees, e.g. "Engine speed". */
  readonly label: string;
  /** Unit written after numbers, e.g. "rpm", "kPa", "K", "°"; "" for plain ratios and fractions. */
  readonly unit: string;
  readonly min: number;
  readonly max: number;
  /** True when `min` itself is not allowed ("more than 0"). */
  readonly minExclusive?: boolean;
  /** True when `max` itself is not allowed ("less than 1"). */
  readonly maxExclusive?: boolean;
  /** Only whole numbers (e.g. a count of injectors). */
  readonly integer?: boolean;
  /** Words added after the range, e.g. "as a fraction: 0.9 means 90 %". */
  readonly hint?: string;
}

/**
 * A number as a person writes it: at most 10 significant digits, thousands grouped with a space
 * from 10 000 up ("25 000"), plain hyphen for negatives; exponent form only for extreme values.
 */
export function formatNumber(x: number): string {
  if (!Number.isFinite(x)) return String(x);
  if (x === 0) return "0";
  const abs = Math.abs(x);
  if (abs >= 1e15 || abs < 1e-6) return String(x);
  const text = String(Number(abs.toPrecision(10)));
  const [whole, fraction] = text.split(".");
  const grouped = whole.length > 4 ? whole.replace(/\B(?=(\d{3})+(?!\d))/g, " ") : whole;
  return `${x < 0 ? "-" : ""}${grouped}${fraction === undefined ? "" : `.${fraction}`}`;
}

/** `value` followed by its unit: "25 000 rpm", "45°", "0.9" (no unit). */
export function withUnit(value: number, unit: string): string {
  const n = formatNumber(value);
  if (unit === "") return n;
  if (unit === "°") return `${n}°`;
  return `${n} ${unit}`;
}

/** For a kelvin figure, the same in °C in brackets (workshops think in °C): " (25 °C)". */
function celsiusAside(kelvin: number): string {
  return ` (${formatNumber(Number((kelvin - KELVIN_AT_0_C).toFixed(2)))} °C)`;
}

/** "between 1 and 25 000 rpm", "more than 0 and at most 1.5", "a whole number from 1 to 32". */
export function describeRange(rule: QuantityRule): string {
  const { min, max, unit } = rule;
  const lo = formatNumber(min);
  const hi = unit === "" ? formatNumber(max) : withUnit(max, unit);
  let text: string;
  if (rule.integer) text = `a whole number from ${lo} to ${hi}`;
  else if (rule.minExclusive && rule.maxExclusive) text = `more than ${lo} and less than ${hi}`;
  else if (rule.minExclusive) text = `more than ${lo} and at most ${hi}`;
  else if (rule.maxExclusive) text = `at least ${lo} and less than ${hi}`;
  else text = `between ${lo} and ${hi}`;
  if (unit === "K") {
    text += ` (${formatNumber(Number((min - KELVIN_AT_0_C).toFixed(2)))} to ${formatNumber(Number((max - KELVIN_AT_0_C).toFixed(2)))} °C)`;
  }
  if (rule.hint) text += ` (${rule.hint})`;
  return text;
}

/** Entered text in quotes, cut at 40 characters. */
function quoteText(text: string): string {
  return JSON.stringify(text.length > 40 ? `${text.slice(0, 40)}…` : text);
}

/** What was entered, in words, ending with a full stop: "-5 rpm.", "no number.", "nothing.". */
export function describeEntered(value: unknown, unit: string): string {
  if (typeof value === "number") {
    if (Number.isNaN(value)) return "something that is not a number.";
    if (!Number.isFinite(value)) return "a number too large to use.";
    return `${withUnit(value, unit)}${unit === "K" ? celsiusAside(value) : ""}.`;
  }
  if (value === undefined || value === null || value === "") return "nothing.";
  if (typeof value === "string") return `${quoteText(value)} (text, not a number).`;
  return "something that is not a number.";
}

/** True when `value` is a finite number inside the rule's range. */
export function isInRange(rule: QuantityRule, value: unknown): value is number {
  if (typeof value !== "number" || !Number.isFinite(value)) return false;
  if (rule.integer && !Number.isInteger(value)) return false;
  if (rule.minExclusive ? !(value > rule.min) : !(value >= rule.min)) return false;
  if (rule.maxExclusive ? !(value < rule.max) : !(value <= rule.max)) return false;
  return true;
}

/** The error for a value outside `rule` (or not a number), in workshop words. */
export function quantityError(rule: QuantityRule, value: unknown, field?: string): CalcInputError {
  return new CalcInputError(rule.label, value, `must be ${describeRange(rule)}`, {
    shown: describeEntered(value, rule.unit),
    field: field ?? rule.label,
  });
}

/**
 * Returns `value` when it is a finite number inside `rule`'s range; otherwise throws a
 * {@link CalcInputError} such as "Engine speed must be between 1 and 25 000 rpm; got -5 rpm."
 * @param field the input's key (e.g. "rpm") recorded on the error for forms.
 */
export function requireQuantity(rule: QuantityRule, value: unknown, field?: string): number {
  if (!isInRange(rule, value)) throw quantityError(rule, value, field);
  return value;
}

/** Same rule under another label, e.g. "Volumetric efficiency at 4 000 rpm". */
export function relabel(rule: QuantityRule, label: string): QuantityRule {
  return { ...rule, label };
}

/**
 * Returns `value` when it is one of `allowed`; otherwise throws in workshop words, e.g.
 * 'Fuel must be one of petrol, E10, E85, methanol; got "diesel".'
 */
export function requireChoice<T extends string>(label: string, value: unknown, allowed: readonly T[], field?: string): T {
  if (typeof value === "string" && (allowed as readonly string[]).includes(value)) return value as T;
  throw new CalcInputError(label, value, `must be one of ${allowed.join(", ")}`, {
    shown: typeof value === "string" ? `${quoteText(value)}.` : "nothing usable.",
    field: field ?? label,
  });
}
