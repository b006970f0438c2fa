/**
 * Splitting an outbox into batches that fit the sync limits (count and JSON bytes), keeping the
 * outbox order. Pure; for the client.
 */
import { SYNC_LIMITS, type Operation } from "./operations";

const encoder = new TextEncoder();
/** Bytes of the batch envelope around the operations, with room for a long device id and cursor. */
const ENVELOPE_BYTES = 256;

export function splitIntoBatches(
  operations: readonly Operation[],
  limits: { maxOperations?: number; maxBodyBytes?: number } = {},
): Operation[][] {
  const maxOps = limits.maxOperations ?? SYNC_LIMITS.maxOperations;
  const maxBytes = (limits.maxBodyBytes ?? SYNC_LIMITS.maxBodyBytes) - ENVELOPE_BYTES;
  const batches: Operation[][] = [];
  let current: Operation[] = [];
  let bytes = 0;
  for (const op of operations) {
    const size = encoder.encode(JSON.stringify(op)).byteLength + 1; // + the comma
    if (size > maxBytes) throw new Error(`operation ${op.id} alone is ${size} bytes, over the batch limit`);
    if (current.length && (current.length >= maxOps || bytes + size > maxBytes)) {
      batches.push(current);
      current = [];
      bytes = 0;
    }
    current.push(op);
    bytes += size;
  }
  if (current.length) batches.push(current);
  return batches;
}
