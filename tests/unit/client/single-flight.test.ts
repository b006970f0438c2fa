import { describe, expect, it } from "vitest";
import { singleFlight } from "@/lib/client/single-flight";

describe("single-flight runner", () => {
  it("runs once when idle, coalesces every trigger during a run into one more run, and passes on failures", async () => {
    const log: string[] = [];
    let n = 0;
    let release: () => void = () => undefined;
    const runner = singleFlight(async () => {
      const mine = ++n;
      log.push(`start ${mine}`);
      await new Promise<void>((r) => (release = r));
      log.push(`end ${mine}`);
      if (mine === 2) throw new Error("second failed");
      return mine;
    });
    const a = runner.run();
    await Promise.resolve();
    expect(runner.running).toBe(true);
    const b = runner.run();
    const c = runner.run();
    await new Promise((r) => setTimeout(r, 0));
    release();
    expect(await a).toBe(1);
    await new Promise((r) => setTimeout(r, 0));
    release();
    await expect(b).rejects.toThrow("second failed");
    await expect(c).rejects.toThrow("second failed");
    expect(log).toEqual(["start 1", "end 1", "start 2", "end 2"]);
    expect(runner.running).toBe(false);
    const d = runner.run();
    await new Promise((r) => setTimeout(r, 0));
    release();
    expect(await d).toBe(3);
  });
});
