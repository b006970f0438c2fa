/**
 * Parts fitted at the bench: when two records name the same serial-numbered part. Pure; used by
 * the merge (to flag a repeat for the supervisor) and by the bench screen (to warn at once).
 */

/** A part, serial or batch number as compared: case, spaces and punctuation ignored ("ag-552 901" = "AG552901"). */
export function plainCode(s: string): string {
  const t = s.normalize("NFKC").toUpperCase();
  return t.replace(/[^\p{L}\p{N}]/gu, "") || t.trim();
}

/** A serial number of a part as compared (`plainCode` of both). */
export function serialKey(partNumber: string, serial: string): string {
  return `${plainCode(partNumber)}\u0000${plainCode(serial)}`;
}

/** The merge's key for a serial-numbered part on one job. */
export const partSerialOnWorkOrder = (workOrderId: string, partNumber: string, serial: string) =>
  `${workOrderId}|${serialKey(partNumber, serial)}`;

/** What the merge knows of a serial-numbered part already on a job. */
export interface SerialOnFile {
  /** The step it was fitted at (null when the office recorded it without one). */
  stepId: string | null;
  /** The bench operation that recorded it (null or absent when the office did). */
  operationId?: string | null;
}

/** The supervisor's flag for a second record of the same serial-numbered part on one job. */
export function repeatedSerialReason(p: { partNumber: string; serial: string }, jobNumber: number, stepTitle: string | null): string {
  const where = stepTitle ? ` at step "${stepTitle}"` : "";
  return `Serial number ${p.serial} of part ${p.partNumber} is already recorded on work order #${jobNumber}${where}: check the part was not recorded twice or fitted twice.`;
}
