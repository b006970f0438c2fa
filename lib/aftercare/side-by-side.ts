// The come-back's page: what the original job recorded beside what is found now, row by row.

export interface PairedRow<T> {
  key: string;
  then: T[];
  now: T[];
}

/**
 * Rows of two records paired by a key (a reading's spec and position, a torque spec's label, a
 * part number): the original's order first, then keys only the come-back has.
 */
export function pairByKey<T>(then: readonly T[], now: readonly T[], keyOf: (t: T) => string): PairedRow<T>[] {
  const rows = new Map<string, PairedRow<T>>();
  const row = (k: string) => {
    let r = rows.get(k);
    if (!r) rows.set(k, (r = { key: k, then: [], now: [] }));
    return r;
  };
  for (const t of then) row(keyOf(t)).then.push(t);
  for (const t of now) row(keyOf(t)).now.push(t);
  return [...rows.values()];
}

/** A reading's place, as people name it: "Main bearing clearance · Journal 2". */
export function readingPlace(r: { label: string; readingIndex: number; readingLabels: readonly string[] }): string {
  return `${r.label} · ${r.readingLabels[r.readingIndex] ?? `reading ${r.readingIndex + 1}`}`;
}
