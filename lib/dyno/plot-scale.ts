/**
 * Axis ranges and tick values for drawing curves (used by the PDF report's vector plot).
 * "Nice" steps of 1, 2, 2.5 or 5 × 10ⁿ — common practice, no source.
 */

/** A step of 1, 2, 2.5 or 5 × 10ⁿ close to span / targetTicks. */
export function niceStep(span: number, targetTicks = 5): number {
  if (!(span > 0) || !Number.isFinite(span)) return 1;
  const raw = span / targetTicks;
  const mag = Math.pow(10, Math.floor(Math.log10(raw)));
  const f = raw / mag;
  const nice = f <= 1 ? 1 : f <= 2 ? 2 : f <= 2.5 ? 2.5 : f <= 5 ? 5 : 10;
  return nice * mag;
}

/** An axis covering [min, max] that starts and ends on ticks, and the ticks. */
export function niceAxis(min: number, max: number, targetTicks = 5): { min: number; max: number; ticks: number[] } {
  if (min === max) {
    min -= 1;
    max += 1;
  }
  const step = niceStep(max - min, targetTicks);
  const lo = Math.floor(min / step) * step;
  const hi = Math.ceil(max / step) * step;
  const ticks: number[] = [];
  for (let v = lo; v <= hi + step / 1e9; v += step) ticks.push(Number(v.toFixed(10)));
  return { min: lo, max: hi, ticks };
}
