/**
 * A compressor map line typed as text, one point a line: corrected flow, then pressure ratio
 * ("12.5, 2.1" or "12.5 2.1"). Read off the maker's sheet by the user; Benchtag ships none.
 */
import type { CompressorMapPoint } from "@/lib/calc";

/** The points of `text`, or throws an Error naming the line and what is wrong with it. */
export function parseOutlineLines(text: string, name: string): CompressorMapPoint[] {
  const points: CompressorMapPoint[] = [];
  const lines = text.split(/\r?\n/);
  lines.forEach((raw, i) => {
    const line = raw.trim();
    if (line === "") return;
    const parts = line.split(/[\s;,]+/).filter(Boolean);
    const nums = parts.map((p) => (/^\d+(\.\d+)?$/.test(p) ? Number(p) : Number.NaN));
    if (parts.length !== 2 || nums.some((n) => Number.isNaN(n))) {
      throw new Error(
        `${name}, line ${i + 1}: write the corrected air flow, then the pressure ratio, as two numbers (e.g. "12.5, 2.1"); got ${JSON.stringify(line.slice(0, 40))}.`,
      );
    }
    points.push({ correctedFlow: nums[0], pressureRatio: nums[1] });
  });
  return points;
}

/** The points back as text, one a line. */
export function outlineLinesText(points: readonly CompressorMapPoint[]): string {
  return points.map((p) => `${p.correctedFlow}, ${p.pressureRatio}`).join("\n");
}
