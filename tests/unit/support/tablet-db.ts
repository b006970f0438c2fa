import "fake-indexeddb/auto";
import { randomUUID } from "node:crypto";
import { afterEach } from "vitest";
import { BenchDb } from "@/lib/client/bench-db";
import { recordOperation } from "@/lib/client/bench-store";
import { ids } from "./job-snapshot";

// A tablet store on an in-memory IndexedDB (fake-indexeddb), fresh per test and deleted after it.

export const author = { userId: ids.mech, deviceId: "tab-1" };

const open: BenchDb[] = [];
afterEach(async () => {
  for (const db of open.splice(0)) await db.delete();
});

export function freshDb(): BenchDb {
  const db = new BenchDb(`test-${randomUUID()}`);
  open.push(db);
  return db;
}

/** This tablet confirms a rod bolt of the test job. */
export const bolt = (db: BenchDb, passIndex: number, b: number) =>
  recordOperation(db, author, ids.job, "torque.bolt-confirmed", { stepId: ids.stepBolts, torqueSpecId: ids.rodSpec, passIndex, bolt: b });
