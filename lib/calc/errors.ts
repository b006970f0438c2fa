/**
 * Input validation shared by every function in `lib/calc`.
 *
 * Every calc function checks its arguments before computing and throws a
 * {@link CalcInputError} for impossible input (non-finite numbers, zero or
 * negative dimensions, efficiencies outside their range, unknown units…)
 * instead of returning NaN or Infinity.
 */

/** Renders a bad value for an error message (strings quoted, NaN/Infinity as words). */
function describeValue(value: unknown): string {
  if (typeof value === "string") return JSON.stringify(value);
  if (typeof value === "number" || typeof value === "bigint" || typeof value === "boolean") {
    return String(value);
  }
  if (value === undefined) return "undefined";
  if (value === null) return "null";
  try {
    const json = JSON.stringify(value);
    return json === undefined ? String(value) : json;
  } catch {
    return String(value);
  }
}

/**
 * Thrown when a calc function receives an impossible input.
 *
 * The message names the argument, what was expected and the value received,
 * e.g. `boreMm must be a finite number > 0; got -86`.
 */
export class CalcInputError extends Error {
  /** Name of the offending argument (dotted path for object fields, e.g. `spec.min`). */
  readonly argument: string;
  /** The value that was received. */
  readonly value: unknown;

  constructor(argument: string, value: unknown, requirement: string) {
    super(`${argument} ${requirement}; got ${describeValue(value)}`);
    this.name = "CalcInputError";
    this.argument = argument;
    this.value = value;
  }
}

/** Throws unless `value` is a finite number; returns it typed as number. */
export function requireFinite(argument: string, value: unknown): number {
  if (typeof value !== "number" || !Number.isFinite(value)) {
    throw new CalcInputError(argument, value, "must be a finite number");
  }
  return value;
}

/** Throws unless `value` is a finite number > 0. */
export function requirePositive(argument: string, value: unknown): number {
  if (typeof value !== "number" || !Number.isFinite(value) || value <= 0) {
    throw new CalcInputError(argument, value, "must be a finite number > 0");
  }
  return value;
}

/** Throws unless `value` is a finite number ≥ 0. */
export function requireNonNegative(argument: string, value: unknown): number {
  if (typeof value !== "number" || !Number.isFinite(value) || value < 0) {
    throw new CalcInputError(argument, value, "must be a finite number ≥ 0");
  }
  return value;
}

/**
 * Throws unless `value` is a finite number inside the given interval.
 * `lowOpen` / `highOpen` make the matching end exclusive.
 */
export function requireInRange(
  argument: string,
  value: unknown,
  low: number,
  high: number,
  { lowOpen = false, highOpen = false }: { lowOpen?: boolean; highOpen?: boolean } = {},
): number {
  const n = typeof value === "number" ? value : Number.NaN;
  const ok = Number.isFinite(n) && (lowOpen ? n > low : n >= low) && (highOpen ? n < high : n <= high);
  if (!ok) {
    const interval = `${lowOpen ? "(" : "["}${low}, ${high}${highOpen ? ")" : "]"}`;
    throw new CalcInputError(argument, value, `must be a finite number in ${interval}`);
  }
  return n;
}

/** Throws unless `value` is an integer in [min, max]. */
export function requireInteger(argument: string, value: unknown, min: number, max: number): number {
  if (typeof value !== "number" || !Number.isInteger(value) || value < min || value > max) {
    throw new CalcInputError(argument, value, `must be an integer from ${min} to ${max}`);
  }
  return value;
}

/** Throws unless `value` is one of the allowed strings. */
export function requireOneOf<T extends string>(argument: string, value: unknown, allowed: readonly T[]): T {
  if (typeof value !== "string" || !(allowed as readonly string[]).includes(value)) {
    throw new CalcInputError(argument, value, `must be one of ${allowed.map((a) => `"${a}"`).join(", ")}`);
  }
  return value as T;
}

/** Throws unless `value` is a non-null object (used for object-shaped arguments). */
export function requireObject(argument: string, value: unknown): Record<string, unknown> {
  if (typeof value !== "object" || value === null || Array.isArray(value)) {
    throw new CalcInputError(argument, value, "must be an object");
  }
  return value as Record<string, unknown>;
}
