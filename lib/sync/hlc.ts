/**
 * Hybrid logical clock (HLC) for bench operations.
 *
 * Every operation a tablet makes carries a stamp. Stamps sort as plain strings (byte order), and
 * the order they give is the order the merge applies operations in:
 *
 *   WWWWWWWWWWWWWWW-CCCCCC-deviceId
 *   └ wall ms, 15 digits, zero-padded
 *                   └ counter, 6 digits, zero-padded
 *                          └ the device that made it (ties between devices break on it)
 *
 * Properties:
 * - a device's stamps only go up, even when its wall clock is set back (the counter carries on);
 * - an event made after a device has seen a stamp (`receive`) sorts after that stamp;
 * - stamps from two devices never compare equal (the device id is part of the stamp).
 *
 * Pure: no clock is read here; callers pass `nowMs` (Date.now() on a tablet).
 */

/** A device id: letters, digits and . _ : - (1–64 characters, starting with a letter or digit). */
export const DEVICE_ID_PATTERN = /^[A-Za-z0-9][A-Za-z0-9._:-]{0,63}$/;
/** A whole stamp; the device part follows {@link DEVICE_ID_PATTERN}. */
export const STAMP_PATTERN = /^(\d{15})-(\d{6})-([A-Za-z0-9][A-Za-z0-9._:-]{0,63})$/;

const WALL_DIGITS = 15;
const COUNTER_DIGITS = 6;
/** Largest counter; one more moves the clock on by a millisecond instead. */
export const MAX_COUNTER = 999_999;
/** Largest wall time a stamp can hold (15 digits of milliseconds). */
const MAX_WALL_MS = 10 ** WALL_DIGITS - 1;

export interface HlcState {
  /** The clock's wall part: the highest wall time seen, in ms since 1970. */
  wallMs: number;
  /** Events counted within `wallMs`. */
  counter: number;
  deviceId: string;
}

interface HlcParts {
  wallMs: number;
  counter: number;
  deviceId: string;
}

export class StampError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "StampError";
  }
}

/** A remote stamp ahead of this device's clock by more than the allowed drift. */
export class ClockDriftError extends Error {
  constructor(
    readonly remoteWallMs: number,
    readonly nowMs: number,
  ) {
    super(`stamp is ${Math.round((remoteWallMs - nowMs) / 1000)} s ahead of this device's clock`);
    this.name = "ClockDriftError";
  }
}

function checkWall(name: string, ms: number): number {
  if (!Number.isSafeInteger(ms) || ms < 0 || ms > MAX_WALL_MS) {
    throw new StampError(`${name} must be a whole number of milliseconds from 0 to ${MAX_WALL_MS} (got ${ms})`);
  }
  return ms;
}

/** A new clock for a device. It has seen nothing yet: the first `tick` takes the wall time. */
export function createClock(deviceId: string): HlcState {
  if (!DEVICE_ID_PATTERN.test(deviceId)) {
    throw new StampError(`device id "${deviceId}" must be 1–64 letters, digits or . _ : - (starting with a letter or digit)`);
  }
  return { wallMs: 0, counter: 0, deviceId };
}

export function formatStamp(parts: HlcParts): string {
  checkWall("wallMs", parts.wallMs);
  if (!Number.isInteger(parts.counter) || parts.counter < 0 || parts.counter > MAX_COUNTER) {
    throw new StampError(`counter must be a whole number from 0 to ${MAX_COUNTER} (got ${parts.counter})`);
  }
  if (!DEVICE_ID_PATTERN.test(parts.deviceId)) throw new StampError(`device id "${parts.deviceId}" is not valid in a stamp`);
  return `${String(parts.wallMs).padStart(WALL_DIGITS, "0")}-${String(parts.counter).padStart(COUNTER_DIGITS, "0")}-${parts.deviceId}`;
}

export function parseStamp(stamp: string): HlcParts {
  const m = STAMP_PATTERN.exec(stamp);
  if (!m) throw new StampError(`"${stamp}" is not a stamp (expected 15-digit ms, 6-digit counter and device id, joined by "-")`);
  return { wallMs: Number(m[1]), counter: Number(m[2]), deviceId: m[3] };
}

/** -1, 0 or 1: the order the merge applies operations in (plain string order; stamps are ASCII). */
export function compareStamps(a: string, b: string): -1 | 0 | 1 {
  return a < b ? -1 : a > b ? 1 : 0;
}

/** Moves a (wall, counter) pair on by one event, carrying into the wall when the counter is full. */
function bump(wallMs: number, counter: number): { wallMs: number; counter: number } {
  return counter >= MAX_COUNTER ? { wallMs: checkWall("wallMs", wallMs + 1), counter: 0 } : { wallMs, counter: counter + 1 };
}

/**
 * A local event (an operation made on this device): returns the advanced clock and the event's stamp.
 * wall = max(clock wall, now); the counter restarts at 0 when the wall moved on, otherwise counts up.
 * A wall clock set backwards therefore never makes a stamp smaller than one already issued.
 */
export function tick(state: HlcState, nowMs: number): { state: HlcState; stamp: string } {
  checkWall("nowMs", nowMs);
  const next = nowMs > state.wallMs ? { wallMs: nowMs, counter: 0 } : bump(state.wallMs, state.counter);
  const s: HlcState = { ...next, deviceId: state.deviceId };
  return { state: s, stamp: formatStamp(s) };
}

/**
 * A stamp seen from elsewhere (a change pulled from the server): advances the clock past it, so that
 * everything this device does afterwards sorts after the remote event.
 * With `maxAheadMs`, a remote wall time further than that ahead of `nowMs` throws {@link ClockDriftError}
 * and the clock is left as it was (a tablet with a wrong clock must not drag the others forward).
 */
export function receive(
  state: HlcState,
  remoteStamp: string,
  nowMs: number,
  opts: { maxAheadMs?: number } = {},
): { state: HlcState; stamp: string } {
  checkWall("nowMs", nowMs);
  const remote = parseStamp(remoteStamp);
  if (opts.maxAheadMs !== undefined && remote.wallMs > nowMs + opts.maxAheadMs) {
    throw new ClockDriftError(remote.wallMs, nowMs);
  }
  const wall = Math.max(state.wallMs, remote.wallMs, nowMs);
  let next: { wallMs: number; counter: number };
  if (wall === state.wallMs && wall === remote.wallMs) next = bump(wall, Math.max(state.counter, remote.counter));
  else if (wall === state.wallMs) next = bump(wall, state.counter);
  else if (wall === remote.wallMs) next = bump(wall, remote.counter);
  else next = { wallMs: wall, counter: 0 };
  const s: HlcState = { ...next, deviceId: state.deviceId };
  return { state: s, stamp: formatStamp(s) };
}
