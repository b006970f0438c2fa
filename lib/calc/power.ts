/**
 * Power ↔ torque at a given engine speed (exact relations).
 *   P[kW] = T[N·m] · n[rpm] · 2π / 60 000
 * (The trade's hp = lbf·ft · rpm / 5252.113 is the same relation in other units: 33 000 / 2π.)
 */
import { requireFinite, requireNonNegative, requirePositive } from "./errors";

/** Seconds per minute × watts per kilowatt: 60 000 (so kW = N·m · rpm · 2π / 60 000). */
const RPM_NM_TO_KW = (2 * Math.PI) / 60000;

/**
 * Power in kW from torque (N·m) at `rpm` (rev/min): P = T · rpm · 2π / 60 000.
 * Torque may be negative (motoring/braking on a dyno); rpm must be ≥ 0.
 */
export function powerKw(torqueNm: number, rpm: number): number {
  requireFinite("torqueNm", torqueNm);
  requireNonNegative("rpm", rpm);
  return torqueNm * rpm * RPM_NM_TO_KW;
}

/**
 * Torque in N·m from power (kW) at `rpm` (rev/min): T = P · 60 000 / (2π · rpm).
 * rpm must be > 0 (torque is undefined at standstill from power alone).
 */
export function torqueNm(powerKw: number, rpm: number): number {
  requireFinite("powerKw", powerKw);
  requirePositive("rpm", rpm);
  return powerKw / (rpm * RPM_NM_TO_KW);
}
