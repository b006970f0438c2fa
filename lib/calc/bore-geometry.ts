/**
 * Cylinder bore geometry from bore-gauge readings: taper and out-of-round.
 * Definitions (engine service practice): out-of-round is the difference between the two
 * perpendicular readings at one depth; taper is the largest minus the smallest reading along the
 * bore in one direction. Results are in the readings' own unit (mm, in or µm — use one throughout).
 */
import { requireObject, requirePositive } from "./errors";

/** Two perpendicular diameters at one depth: across the thrust faces and along the gudgeon-pin axis. */
export interface BoreDepthReading {
  thrust: number;
  pin: number;
}

/** Bore-gauge readings at three depths (near the top of ring travel, middle, bottom of the bore). */
export interface BoreReadings {
  top: BoreDepthReading;
  middle: BoreDepthReading;
  bottom: BoreDepthReading;
}

export interface BoreGeometry {
  /** Taper per axis = max − min of the three depths along that axis; `max` the larger of the two. */
  taper: { thrust: number; pin: number; max: number };
  /** Out-of-round per depth = |thrust − pin|; `max` the largest of the three. */
  outOfRound: { top: number; middle: number; bottom: number; max: number };
  /** Largest and smallest of the six readings (for wear-limit checks). */
  largest: number;
  smallest: number;
}

const DEPTHS = ["top", "middle", "bottom"] as const;

/**
 * Taper and out-of-round of one bore from six readings (same unit in, same unit out).
 * taper(axis) = max(readings along axis) − min(readings along axis);
 * outOfRound(depth) = |thrust − pin| at that depth. All readings must be finite and > 0.
 */
export function boreGeometry(readings: BoreReadings): BoreGeometry {
  requireObject("readings", readings);
  const thrust: number[] = [];
  const pin: number[] = [];
  for (const depth of DEPTHS) {
    const r = requireObject(`readings.${depth}`, readings[depth]);
    thrust.push(requirePositive(`readings.${depth}.thrust`, r.thrust));
    pin.push(requirePositive(`readings.${depth}.pin`, r.pin));
  }
  const taperThrust = Math.max(...thrust) - Math.min(...thrust);
  const taperPin = Math.max(...pin) - Math.min(...pin);
  const [oorTop, oorMiddle, oorBottom] = thrust.map((t, i) => Math.abs(t - pin[i]));
  return {
    taper: { thrust: taperThrust, pin: taperPin, max: Math.max(taperThrust, taperPin) },
    outOfRound: { top: oorTop, middle: oorMiddle, bottom: oorBottom, max: Math.max(oorTop, oorMiddle, oorBottom) },
    largest: Math.max(...thrust, ...pin),
    smallest: Math.min(...thrust, ...pin),
  };
}
