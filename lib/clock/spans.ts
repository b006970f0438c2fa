/**
 * Time at the bench, as pure arithmetic: a mechanic's clock-ons and the records that end them
 * (their own clock-off, a supervisor's close of a forgotten clock) become spans of time.
 *
 * The rules (also in lib/sync/README.md, "Time at the bench"):
 * - a clock ends at the earliest of: its earliest clock-off or supervisor close, and the next
 *   clock-on of the same mechanic (one open clock per mechanic: clocking on elsewhere ends the
 *   clock that was running, at the new clock-on's time);
 * - a clock with no end is running: it counts up to `nowMs`, marked `running`;
 * - the result depends only on the records, never on the order they arrived in.
 */

export interface ClockRecord {
  id: string;
  mechanicId: string;
  workOrderId: string;
  /** The stage it was clocked on, when one was named. */
  jobProcedureId: string | null;
  stageKey: string | null;
  startedAtMs: number;
}

export type ClockEndKind = "clocked-off" | "closed-by-supervisor";

export interface ClockEndRecord {
  clockId: string;
  kind: ClockEndKind;
  endedAtMs: number;
}

export type SpanEnd = ClockEndKind | "next-clock-on" | "running";

export interface ClockSpan extends ClockRecord {
  /** When it ended, or `nowMs` while it runs. */
  endedAtMs: number;
  endedBy: SpanEnd;
  running: boolean;
}

/** The clocks and ends of a job as its snapshot carries them (lib/sync/snapshot.ts `clocks`), as records. */
export function recordsOfJobClocks(
  workOrderId: string,
  clocks: ReadonlyArray<{
    id: string;
    mechanicId: string;
    jobProcedureId: string | null;
    stageKey: string | null;
    startedAt: string;
    ends: ReadonlyArray<{ kind: ClockEndKind; endedAt: string }>;
  }>,
): { clocks: ClockRecord[]; ends: ClockEndRecord[] } {
  return {
    clocks: clocks.map((c) => ({
      id: c.id,
      mechanicId: c.mechanicId,
      workOrderId,
      jobProcedureId: c.jobProcedureId,
      stageKey: c.stageKey,
      startedAtMs: Date.parse(c.startedAt),
    })),
    ends: clocks.flatMap((c) => c.ends.map((e) => ({ clockId: c.id, kind: e.kind, endedAtMs: Date.parse(e.endedAt) }))),
  };
}

const byStart = (a: ClockRecord, b: ClockRecord) => a.startedAtMs - b.startedAtMs || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0);

/** The earliest end on record of each clock (ends before their clock's start are never stored; ignored here too). */
export function earliestEnds(ends: readonly ClockEndRecord[]): Map<string, ClockEndRecord> {
  const out = new Map<string, ClockEndRecord>();
  for (const e of ends) {
    const held = out.get(e.clockId);
    if (!held || e.endedAtMs < held.endedAtMs) out.set(e.clockId, e);
  }
  return out;
}

/**
 * The spans of `clocks`: each clock with when and how it ended. `sameMechanic` lists every clock of
 * the mechanics concerned (their next clock-on may be on another job); it defaults to `clocks`.
 */
export function clockSpans(
  clocks: readonly ClockRecord[],
  ends: readonly ClockEndRecord[],
  nowMs: number,
  sameMechanic: readonly ClockRecord[] = clocks,
): ClockSpan[] {
  const earliest = earliestEnds(ends);
  const next = new Map<string, ClockRecord>();
  const perMechanic = new Map<string, ClockRecord[]>();
  for (const c of [...sameMechanic, ...clocks]) {
    const list = perMechanic.get(c.mechanicId) ?? [];
    if (!list.some((x) => x.id === c.id)) list.push(c);
    perMechanic.set(c.mechanicId, list);
  }
  for (const list of perMechanic.values()) {
    list.sort(byStart);
    for (let i = 0; i + 1 < list.length; i++) next.set(list[i].id, list[i + 1]);
  }
  return [...clocks].sort(byStart).map((c) => {
    const own = earliest.get(c.id);
    const following = next.get(c.id);
    const candidates: Array<{ at: number; by: SpanEnd }> = [];
    if (own) candidates.push({ at: Math.max(own.endedAtMs, c.startedAtMs), by: own.kind });
    if (following) candidates.push({ at: following.startedAtMs, by: "next-clock-on" });
    candidates.sort((a, b) => a.at - b.at);
    const end = candidates[0];
    if (!end) return { ...c, endedAtMs: Math.max(nowMs, c.startedAtMs), endedBy: "running", running: true };
    return { ...c, endedAtMs: end.at, endedBy: end.by, running: false };
  });
}

/** The clock of `mechanicId` running at `atMs` (started at or before it, not ended by then), if any. */
export function openClockAt(
  mechanicId: string,
  atMs: number,
  clocks: readonly ClockRecord[],
  ends: readonly ClockEndRecord[],
): ClockRecord | null {
  const mine = clocks.filter((c) => c.mechanicId === mechanicId && c.startedAtMs <= atMs);
  if (!mine.length) return null;
  const spans = clockSpans(mine, ends, Number.POSITIVE_INFINITY);
  const last = spans[spans.length - 1];
  return last.running || last.endedAtMs > atMs ? last : null;
}
