import type { Kysely } from "kysely";
import type { Database } from "../schema";
import { insertAssignedDemoJobs } from "./demo-late-work";

// Three invented jobs kept fresh for the browser tests of the bench's own checks: work orders
// 1020–1022, tags GSW-0020…GSW-0022, in build and assigned to the mechanic Tomas Reyes.
// - 1020: bottom end and cylinder head, for the two-tablet run with the network flapping;
// - 1021: bottom end, for stopping and cancelling the cure timer from the bench;
// - 1022: bottom end, for the questions asked before an unlikely reading or wrench value is saved.

const CHAOS = { number: 1020, tag: "GSW-0020", make: "Skua", model: "Tracker 650", year: 2018, cc: 649, colour: "Black" };
const BOTTOM_END = [
  { number: 1021, tag: "GSW-0021", make: "Shrike", model: "Sprint 900", year: 2012, cc: 899, colour: "Blue" },
  { number: 1022, tag: "GSW-0022", make: "Tern", model: "Seven Twenty", year: 2016, cc: 718, colour: "White" },
];

/** Whether jobs 1020–1022 are on file. */
export async function demoBenchChecksExist(db: Kysely<Database>, shopId: string): Promise<boolean> {
  const row = await db
    .selectFrom("work_orders")
    .select("id")
    .where("shop_id", "=", shopId)
    .where("number", "=", CHAOS.number)
    .executeTakeFirst();
  return Boolean(row);
}

/** Writes jobs 1020–1022 for the demo shop. */
export async function seedDemoBenchChecks(db: Kysely<Database>, shopId: string): Promise<void> {
  await insertAssignedDemoJobs(db, shopId, [CHAOS], ["bottom-end-assembly", "cylinder-head-installation"], "Bottom-end and head rebuild");
  await insertAssignedDemoJobs(db, shopId, BOTTOM_END, ["bottom-end-assembly"], "Bottom-end rebuild after a spun bearing");
}
