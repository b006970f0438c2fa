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
  let caught: unknown;
  try {
    fn();
  } catch (e) {
    caught = e;
  }
  expect(caught, `expected a CalcInputError for ${argument}`).toBeInstanceOf(CalcInputError);
  const err = caught as CalcInputError;
  expect(err.argument).toBe(argument);
  expect(err.message.startsWith(argument)).toBe(true);
  expect(err.message).toMatch(/; got /);
  if (pattern) expect(err.message).toMatch(pattern);
  return err;
}
