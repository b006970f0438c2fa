import { describe, expect, it } from "vitest";
import { singleFlight } from "@/lib/client/single-flight";
import { syncSchedule, type SyncScheduleEnv } from "@/lib/client/sync-schedule";

/** A browser stand-in: the network state and the events are set by the test. */
function fakeEnv(online = true) {
  const listeners = { online: new Set<() => void>(), shown: new Set<() => void>(), tick: new Set<() => void>() };
  const sub = (set: Set<() => void>) => (cb: () => void) => {
    set.add(cb);
    return () => set.delete(cb);
  };
  const env: SyncScheduleEnv & { online: boolean } = {
    online,
    isOnline: () => env.online,
    onOnline: sub(listeners.online),
    onShown: sub(listeners.shown),
    every: (_ms, cb) => sub(listeners.tick)(cb),
  };
  const fire = (what: keyof typeof listeners) => listeners[what].forEach((cb) => cb());
  const subscribed = () => listeners.online.size + listeners.shown.size + listeners.tick.size;
  return { env, fire, subscribed };
}

/** A sync run the test ends by hand. */
function manualRuns() {
  const ends: (() => void)[] = [];
  let started = 0;
  const task = () =>
    new Promise<void>((resolve) => {
      started++;
      ends.push(resolve);
    });
  return { task, ends, started: () => started };
}

const settle = () => new Promise((r) => setTimeout(r, 0));

describe("the bench's sync schedule", () => {
  it("runs at start, on every tick, when the network returns and when the screen is shown again", async () => {
    const { env, fire } = fakeEnv();
    let runs = 0;
    syncSchedule(async () => void runs++, { everyMs: 20_000, env, onBusy: () => undefined });
    expect(runs).toBe(1);
    for (const what of ["tick", "online", "shown"] as const) {
      await settle(); // the run before it has ended
      fire(what);
    }
    await settle();
    expect(runs).toBe(4);
  });

  it("never runs while the browser is offline, and runs at once when the network returns", async () => {
    const { env, fire } = fakeEnv(false);
    let runs = 0;
    const s = syncSchedule(async () => void runs++, { everyMs: 20_000, env, onBusy: () => undefined });
    fire("tick");
    fire("shown");
    s.now();
    expect(runs).toBe(0);
    env.online = true;
    fire("online");
    expect(runs).toBe(1);
  });

  it("says it is busy from the first trigger until the last run it asked for has ended", async () => {
    const { env } = fakeEnv();
    const runs = manualRuns();
    const flight = singleFlight(runs.task);
    const busy: boolean[] = [];
    const s = syncSchedule(() => flight.run(), { everyMs: 20_000, env, onBusy: (b) => busy.push(b) });
    s.now(); // during the first run: one more after it, never alongside
    s.now();
    await settle();
    expect(runs.started()).toBe(1);
    runs.ends[0]();
    await settle();
    expect(runs.started()).toBe(2);
    expect(busy).toEqual([true]);
    runs.ends[1]();
    await settle();
    expect(busy).toEqual([true, false]);
  });

  it("a poll or the screen shown during a run adds nothing; a save or the network's return asks for one more run", async () => {
    const { env, fire } = fakeEnv();
    const runs = manualRuns();
    const flight = singleFlight(runs.task);
    const s = syncSchedule(() => flight.run(), { everyMs: 20_000, env, onBusy: () => undefined });
    fire("tick");
    fire("shown");
    await settle();
    runs.ends[0]();
    await settle();
    expect(runs.started()).toBe(1); // nothing queued behind the first run
    fire("tick");
    await settle();
    expect(runs.started()).toBe(2);
    s.now();
    fire("online");
    runs.ends[1]();
    await settle();
    expect(runs.started()).toBe(3); // one more after it, for both
    runs.ends[2]();
    await settle();
    expect(runs.started()).toBe(3);
  });

  it("a failed run ends the busy state and the next trigger runs again", async () => {
    const { env, fire } = fakeEnv();
    let runs = 0;
    const busy: boolean[] = [];
    syncSchedule(
      async () => {
        runs++;
        throw new Error("no network");
      },
      { everyMs: 20_000, env, onBusy: (b) => busy.push(b) },
    );
    await settle();
    expect(busy).toEqual([true, false]);
    fire("tick");
    await settle();
    expect(runs).toBe(2);
  });

  it("once stopped, hears no event and starts no run", async () => {
    const { env, fire, subscribed } = fakeEnv();
    let runs = 0;
    const s = syncSchedule(async () => void runs++, { everyMs: 20_000, env, onBusy: () => undefined });
    expect(subscribed()).toBe(3);
    s.stop();
    expect(subscribed()).toBe(0);
    fire("tick");
    s.now();
    expect(runs).toBe(1);
  });
});
