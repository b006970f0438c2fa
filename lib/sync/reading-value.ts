/**
 * A reading's value as the mechanic typed it: a decimal text, kept to the digit. "0.030" stays
 * "0.030" — the trailing zero says the instrument reads to the thousandth, and that is part of the
 * record. PostgreSQL `numeric` keeps the scale of what it is given, so the text goes in as it is
 * and comes back the same.
 *
 * The canonical form is PostgreSQL's own text for the number: an optional minus, the whole part
 * without leading zeros (at least "0"), and the fraction as typed; a zero has no minus. Tablets
 * before this version sent a JSON number: it is turned into the shortest decimal that reads back
 * as that number, which is what it showed on their screen.
 *
 * Only texts that a JavaScript number holds exactly are taken: every text of at most 15
 * significant digits, and the (up to 17-digit) text an older tablet's number prints as. So the
 * exact verdict (`lib/calc/tolerance.ts`, which compares the decimal a number prints as) sees
 * exactly the typed value.
 */
import type { MeasurementUnit } from "@/lib/calc/units";

/** Significant digits any typed reading may carry (text → number → decimal is then always exact). */
export const MAX_READING_DIGITS = 15;

/**
 * Largest size of a reading, per unit: nothing on an engine comes near 2 m, and no chamber or cylinder near 2 litres. Larger values are
 * refused by the wire format (a slip of the finger or a broken instrument, never a reading).
 */
export const READING_MAGNITUDE_LIMIT: Record<MeasurementUnit, number> = { mm: 2000, in: 80, µm: 2_000_000, cc: 2000 };

const DECIMAL = /^(-?)(\d+)(?:\.(\d+))?$/;

/** The canonical decimal text of a typed value, or null when it is not a plain decimal ("1e3", ".5", "5.", "", "NaN"). */
export function canonicalDecimal(typed: string): string | null {
  const m = DECIMAL.exec(typed.trim().replace("−", "-"));
  if (!m) return null;
  const [, sign, whole, fraction] = m;
  const w = whole.replace(/^0+(?=\d)/, "");
  const text = fraction === undefined ? w : `${w}.${fraction}`;
  const zero = /^[0.]+$/.test(text);
  return sign && !zero ? `-${text}` : text;
}

/** The decimal text a JSON number from an older tablet stands for (the shortest that reads back as it); null for NaN or ±Infinity. */
export function decimalOfNumber(n: number): string | null {
  if (!Number.isFinite(n)) return null;
  const s = String(n);
  const m = /^(-?)(\d+)(?:\.(\d+))?e([+-]\d+)$/.exec(s);
  if (!m) return canonicalDecimal(s);
  // 1e-7, 1.5e+21: write the exponent out in plain digits
  const [, sign, whole, fraction = "", exp] = m;
  const digits = whole + fraction;
  const point = whole.length + Number(exp);
  const text =
    point <= 0
      ? `0.${"0".repeat(-point)}${digits}`
      : point >= digits.length
        ? digits + "0".repeat(point - digits.length)
        : `${digits.slice(0, point)}.${digits.slice(point)}`;
  return canonicalDecimal(sign + text);
}

/** Significant digits of a canonical decimal text (leading zeros do not count; trailing ones do). */
export function significantDigits(text: string): number {
  const digits = text.replace(/[-.]/g, "").replace(/^0+/, "");
  return Math.max(1, digits.length);
}

/** Whether a JavaScript number holds the text's value exactly (so the verdict compares exactly what was typed). */
export function heldExactly(text: string): boolean {
  if (significantDigits(text) <= MAX_READING_DIGITS) return true;
  // past 15 digits, only the text an older tablet's number prints as (its shortest decimal, never
  // with trailing zeros): "31.5" followed by 20,000 zeros is no reading, and PostgreSQL's numeric
  // keeps at most 16,383 decimal places (the whole sync batch failed on one such entry)
  return decimalOfNumber(Number(text)) === text;
}

/** Why a reading text cannot be stored, in the mechanic's words, or null when it can. */
export function readingValueProblem(text: string, unit: MeasurementUnit): string | null {
  if (!heldExactly(text)) {
    return `Value: at most ${MAX_READING_DIGITS} digits; no instrument at the bench reads finer.`;
  }
  const limit = READING_MAGNITUDE_LIMIT[unit];
  if (Math.abs(Number(text)) > limit) {
    return `Value: ${text} ${unit} is beyond anything on an engine (the most is ${limit} ${unit}); check the instrument and type it again.`;
  }
  return null;
}
