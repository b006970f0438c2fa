import { expect } from "vitest";
import { CalcInputError } from "@/lib/calc";

/** |actual − expected| ≤ rel · max(|actual|, |expected|) (both zero passes). */
export function isRelClose(actual: number, expected: number, rel: number): boolean {
  return Math.abs(actual - expected) <= rel * Math.max(Math.abs(actual), Math.abs(expected));
}

export function expectRelClose(actual: number, expected: number, rel: number): void {
  if (!isRelClose(actual, expected, rel)) {
    throw new Error(`expected ${actual} to be within ${rel} (relative) of ${expected}`);
  }
}

/** |actual − expected| ≤ tol. */
export function expectWithin(actual: number, expected: number, tol: number): void {
  expect(Math.abs(actual - expected), `${actual} vs ${expected} ± ${tol}`).toBeLessThanOrEqual(tol);
}

/**
 * Asserts `fn` throws a CalcInputError whose message starts with the argument's name and
 * (optionally) matches `pattern`.
 */
export function expectCalcError(fn: () => unknown, argument: string, pattern?: RegExp): CalcInputError {
  const err = catchCalcError(fn, argument);
  expect(err.argument).toBe(argument);
  expect(err.message.startsWith(argument)).toBe(true);
  expect(err.message).toMatch(/; got /);
  if (pattern) expect(err.message).toMatch(pattern);
  return err;
}

/**
 * Asserts `fn` throws a CalcInputError in workshop words: the message starts with `label` (the name
 * the user sees), ends with a full stop, and carries no internal names (camelCase keys, dotted
 * paths) and no "NaN", "Infinity", "undefined" or "null". Optionally matches `pattern` and checks
 * the error's `field` (the input's key, for forms).
 */
export function expectWorkshopError(fn: () => unknown, label: string, pattern?: RegExp, field?: string): CalcInputError {
  const err = catchCalcError(fn, label);
  expect(err.argument).toBe(label);
  expect(err.message.startsWith(`${label} `), err.message).toBe(true);
  expect(err.message.endsWith("."), err.message).toBe(true);
  const withoutUnits = err.message.replace(/\b(kPa|kWh|kW|inHg|mmHg)\b/g, "");
  expect(withoutUnits, "no camelCase internal names").not.toMatch(/\b[a-z]+[A-Z][A-Za-z]*\b/);
  expect(err.message, "no dotted or indexed paths").not.toMatch(/\w\.\w+[A-Za-z]|\[\d+\]/);
  expect(err.message).not.toMatch(/NaN|Infinity|undefined|null/);
  if (pattern) expect(err.message).toMatch(pattern);
  if (field !== undefined) expect(err.field).toBe(field);
  return err;
}

/** Runs `fn` and returns the CalcInputError it throws (fails the test if it throws nothing else). */
function catchCalcError(fn: () => unknown, what: string): CalcInputError {
  let caught: unknown;
  try {
    fn();
  } catch (e) {
    caught = e;
  }
  expect(caught, `expected a CalcInputError for ${what}`).toBeInstanceOf(CalcInputError);
  return caught as CalcInputError;
}
