/**
 * Straight-line interpolation on a table of points (a VE curve against rpm, a map line's flow
 * against pressure ratio). No extrapolation: outside the table the answer is "not covered".
 */

/**
 * y at `x` by linear interpolation between the two table points around it.
 * `xs` must be strictly increasing and the same length as `ys` (callers check their input).
 * Returns null when `x` lies outside [xs[0], xs[last]].
 */
export function interpolateLinear(xs: readonly number[], ys: readonly number[], x: number): number | null {
  const last = xs.length - 1;
  if (last < 0 || !(x >= xs[0] && x <= xs[last])) return null;
  if (x === xs[last]) return ys[last];
  let i = 0;
  while (xs[i + 1] <= x) i++;
  const t = (x - xs[i]) / (xs[i + 1] - xs[i]);
  return ys[i] + t * (ys[i + 1] - ys[i]);
}
