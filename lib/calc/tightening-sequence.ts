/**
 * Bolt tightening orders and bolt positions for drawing them.
 *
 * Bolt numbers start at 1. Patterns:
 * - `"cross"` — star/cross pattern for a circular flange or cover, bolts numbered clockwise.
 * - `"spiral-out"` — cylinder head with two rows of bolts, centre first, working outwards.
 * - `"linear"` — 1, 2, …, N in order (a single row, e.g. a rail or cap set done end to end).
 */
import { requireInteger, requireOneOf, CalcInputError } from "./errors";

export const TIGHTENING_PATTERNS = ["cross", "spiral-out", "linear"] as const;
export type TighteningPattern = (typeof TIGHTENING_PATTERNS)[number];

/** Largest bolt count accepted (a sanity bound against runaway input). */
export const MAX_BOLT_COUNT = 1024;

/** A bolt's position for drawing: x, y in a unit box [0, 1] × [0, 1], y pointing down (SVG convention). */
export interface BoltPosition {
  bolt: number;
  x: number;
  y: number;
}

function checkPatternAndCount(pattern: unknown, boltCount: unknown): TighteningPattern {
  const p = requireOneOf("pattern", pattern, TIGHTENING_PATTERNS);
  const min = p === "linear" ? 1 : 2;
  requireInteger("boltCount", boltCount, min, MAX_BOLT_COUNT);
  if (p === "spiral-out" && (boltCount as number) % 2 !== 0) {
    throw new CalcInputError("boltCount", boltCount, 'must be even for "spiral-out" (two rows of bolts)');
  }
  return p;
}

/** Reverses the lowest `bits` bits of `value` (bit-reversal permutation). */
function reverseBits(value: number, bits: number): number {
  let out = 0;
  for (let i = 0; i < bits; i++) out = (out << 1) | ((value >> i) & 1);
  return out;
}

/**
 * Cross order, 0-based positions.
 * Even N = 2^k · m (m odd): for c = 0 … m−1, for r = 0 … 2^k−1: position bitrev_k(r) · m + c.
 *   With m = 1 this is the bit-reversal order of ASME PCC-1's legacy cross pattern
 *   (16 → 1-9-5-13-3-11-7-15-2-10-6-14-4-12-8-16); with m = 3 it gives its 12-bolt order
 *   (1-7-4-10-2-8-5-11-3-9-6-12). Every second bolt is the one diametrically opposite the
 *   bolt before it, and the first 2^j bolts (j ≤ k) are evenly spaced round the flange.
 * Odd N: star polygon — each next bolt is (N−1)/2 positions further clockwise, the nearest
 *   to opposite an odd count allows (angle 180°·(N−1)/N), e.g. 5 → 1-3-5-2-4.
 */
function crossPositions(n: number): number[] {
  const out: number[] = [];
  if (n % 2 === 1) {
    const step = (n - 1) / 2;
    for (let i = 0; i < n; i++) out.push((i * step) % n);
    return out;
  }
  let k = 0;
  let m = n;
  while (m % 2 === 0) {
    m /= 2;
    k++;
  }
  const blockSize = 2 ** k;
  for (let c = 0; c < m; c++) {
    for (let r = 0; r < blockSize; r++) out.push(reverseBits(r, k) * m + c);
  }
  return out;
}

/** Columns of a two-row head grouped in rings from the centre outwards (0-based, left → right). */
function headRings(columns: number): number[][] {
  const rings: number[][] = [];
  if (columns % 2 === 1) {
    const centre = (columns - 1) / 2;
    rings.push([centre]);
    for (let d = 1; d <= centre; d++) rings.push([centre - d, centre + d]);
  } else {
    const half = columns / 2;
    for (let d = 0; d < half; d++) rings.push([half - 1 - d, half + d]);
  }
  return rings;
}

/**
 * Spiral-out order for a two-row head of N bolts (N even), N/2 columns.
 * Numbering convention (seen from above, intake row drawn at the top): bolts 1 … N/2 along the
 * intake row left → right, then N/2+1 … N along the exhaust row right → left, i.e. clockwise.
 * So the intake bolt in column c (0-based from the left) is c + 1, the exhaust bolt is N − c.
 * Order: column rings from the centre outwards. An odd column count starts with the centre
 * column (intake, then exhaust). Each ring of two columns (l, r) is crossed diagonally,
 * alternating the starting corner ring by ring so every ring starts across from where the last
 * one ended: first ring intake-l, exhaust-r, intake-r, exhaust-l; next ring intake-r, exhaust-l,
 * intake-l, exhaust-r; and so on.
 * Example, 10 bolts (1 2 3 4 5 over 10 9 8 7 6): 3-8-2-7-4-9-5-10-1-6.
 */
function spiralOutOrder(n: number): number[] {
  const columns = n / 2;
  const intake = (c: number) => c + 1;
  const exhaust = (c: number) => n - c;
  const out: number[] = [];
  let pairRing = 0;
  for (const ring of headRings(columns)) {
    if (ring.length === 1) {
      out.push(intake(ring[0]), exhaust(ring[0]));
      continue;
    }
    const [l, r] = ring;
    if (pairRing % 2 === 0) out.push(intake(l), exhaust(r), intake(r), exhaust(l));
    else out.push(intake(r), exhaust(l), intake(l), exhaust(r));
    pairRing++;
  }
  return out;
}

/**
 * Tightening order: an array of bolt numbers (1-based) in the order to tighten them; always a
 * permutation of 1 … boltCount.
 *
 * - `"cross"` (boltCount ≥ 2): circular flange, bolts numbered clockwise from 1. Matches ASME PCC-1's
 *   legacy cross pattern for 4, 8, 12 and 16 bolts (4 → 1-3-2-4; 8 → 1-5-3-7-2-6-4-8;
 *   12 → 1-7-4-10-2-8-5-11-3-9-6-12; 16 → 1-9-5-13-3-11-7-15-2-10-6-14-4-12-8-16).
 *   Other even counts N = 2^k·m (m odd): bolt pairs straight across the flange, the pairs spread by
 *   bit reversal, then shifted one bolt clockwise m times (6 → 1-4-2-5-3-6). Odd counts: star
 *   polygon stepping (N−1)/2 bolts each time (5 → 1-3-5-2-4; 7 → 1-4-7-3-6-2-5).
 * - `"spiral-out"` (even boltCount ≥ 2): two-row cylinder head; intake row numbered 1 … N/2 left → right,
 *   exhaust row N/2+1 … N right → left (clockwise seen from above). Centre column(s) first, then
 *   each ring of columns outwards crossed diagonally (10 → 3-8-2-7-4-9-5-10-1-6).
 * - `"linear"` (boltCount ≥ 1): 1, 2, …, N.
 */
export function tighteningSequence(pattern: TighteningPattern, boltCount: number): number[] {
  const p = checkPatternAndCount(pattern, boltCount);
  switch (p) {
    case "cross":
      return crossPositions(boltCount).map((pos) => pos + 1);
    case "spiral-out":
      return spiralOutOrder(boltCount);
    case "linear":
      return Array.from({ length: boltCount }, (_, i) => i + 1);
  }
}

/**
 * 2-D positions for drawing a pattern's bolts, in bolt-number order (bolt 1 first), inside the
 * unit box [0, 1] × [0, 1] with y pointing down (SVG).
 * - `"cross"`: circle centred (0.5, 0.5), radius 0.4; bolt 1 at 12 o'clock, numbers rising clockwise:
 *   x = 0.5 + 0.4·sin θ, y = 0.5 − 0.4·cos θ, θ = 2π·(bolt − 1)/N.
 * - `"spiral-out"`: intake row at y = 0.35 (bolts 1 … N/2 left → right), exhaust row at y = 0.65
 *   (bolts N/2+1 … N right → left); columns evenly spaced from x = 0.1 to 0.9 (0.5 for one column).
 * - `"linear"`: one row at y = 0.5, x evenly spaced from 0.1 to 0.9 (0.5 for one bolt).
 */
export function boltLayout(pattern: TighteningPattern, boltCount: number): BoltPosition[] {
  const p = checkPatternAndCount(pattern, boltCount);
  const n = boltCount;
  const spread = (i: number, count: number) => (count === 1 ? 0.5 : 0.1 + (0.8 * i) / (count - 1));
  const out: BoltPosition[] = [];
  for (let bolt = 1; bolt <= n; bolt++) {
    if (p === "cross") {
      const theta = (2 * Math.PI * (bolt - 1)) / n;
      out.push({ bolt, x: 0.5 + 0.4 * Math.sin(theta), y: 0.5 - 0.4 * Math.cos(theta) });
    } else if (p === "spiral-out") {
      const columns = n / 2;
      const intakeRow = bolt <= columns;
      const column = intakeRow ? bolt - 1 : n - bolt;
      out.push({ bolt, x: spread(column, columns), y: intakeRow ? 0.35 : 0.65 });
    } else {
      out.push({ bolt, x: spread(bolt - 1, n), y: 0.5 });
    }
  }
  return out;
}
