// Drawing stock for a part fitted at the bench. Pure: the merge loads the lots (locked), asks this
// what to take, and writes the movements. A fit is never refused here: what the shelf cannot cover
// is counted as short and the fit is flagged, so the stock on record never goes below zero.

/** One delivered lot of a part as it stands: on hand, put aside in all, and put aside per job. */
export interface LotBalance {
  id: string;
  location: string;
  onHand: number;
  reserved: number;
  /** Outstanding quantity put aside for each work order (id → quantity). */
  reservedFor: Map<string, number>;
}

export interface Draw {
  lotId: string;
  quantity: number;
  /** How much of it was the job's own reservation. */
  reservedUsed: number;
}

export interface DrawPlan {
  draws: Draw[];
  /** Fitted but not on the shelf as recorded. */
  short: number;
  /** Some of it was stock put aside for another job. */
  tookReserved: boolean;
}

/**
 * What a fit of `quantity` on `workOrderId` takes from `lots` (oldest first), and changes them to
 * match: the job's own reservation first, then free stock, then (only when nothing else is left)
 * stock put aside for other jobs. Never takes a lot below zero.
 */
export function planDraw(lots: readonly LotBalance[], workOrderId: string, quantity: number): DrawPlan {
  let remaining = quantity;
  const taken = new Map<string, Draw>();
  let tookReserved = false;
  const take = (lot: LotBalance, n: number, reservedUsed: number) => {
    if (n <= 0) return;
    const d = taken.get(lot.id) ?? { lotId: lot.id, quantity: 0, reservedUsed: 0 };
    d.quantity += n;
    d.reservedUsed += reservedUsed;
    taken.set(lot.id, d);
    lot.onHand -= n;
    remaining -= n;
  };
  for (const lot of lots) {
    const mine = Math.min(remaining, lot.reservedFor.get(workOrderId) ?? 0, lot.onHand);
    if (mine > 0) {
      lot.reservedFor.set(workOrderId, (lot.reservedFor.get(workOrderId) ?? 0) - mine);
      lot.reserved -= mine;
      take(lot, mine, mine);
    }
  }
  for (const lot of lots) take(lot, Math.min(remaining, Math.max(0, lot.onHand - lot.reserved)), 0);
  for (const lot of lots) {
    const n = Math.min(remaining, lot.onHand);
    if (n > 0) tookReserved = true;
    take(lot, n, 0);
  }
  return { draws: [...taken.values()], short: remaining, tookReserved };
}

/** "batch L24-118" / "serial GS-0042": how a fit names the part it used. */
export function lotName(fit: { serial?: string | null; batch?: string | null }): string {
  return fit.serial ? `serial ${fit.serial}` : `batch ${fit.batch}`;
}

/** The supervisor's flag for a fit stock could not cover, or null when it drew cleanly. */
export function stockFlagReason(
  fit: { partNumber: string; serial?: string | null; batch?: string | null; quantity: number },
  plan: DrawPlan,
  lotsFound: number,
): string | null {
  const part = `part ${fit.partNumber} ${lotName(fit)}`;
  if (lotsFound === 0)
    return `Stock: ${part} was never received into stock, so nothing was drawn. The fit is kept: check where the part came from and receive it if it is ours.`;
  if (plan.short > 0) {
    const drawn = fit.quantity - plan.short;
    return `Stock short: ${fit.quantity} of ${part} fitted but only ${drawn} left on the shelf as recorded. The fit is kept and stock stays at 0: count the shelf and check who else fitted this ${fit.serial ? "part" : "batch"}.`;
  }
  if (plan.tookReserved)
    return `Stock: ${part} was taken from stock put aside for another job. The fit is kept: check that job still has its part.`;
  return null;
}

/** A flag reason with the stock's added (a fit may be flagged for two things). */
export function withStockReason(existing: string | null, stock: string | null): string | null {
  if (!stock) return existing;
  return existing ? `${existing} Also: ${stock}` : stock;
}
