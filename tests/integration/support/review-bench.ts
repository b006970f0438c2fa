import type { Kysely } from "kysely";
import { mergeBatch } from "@/db/sync/merge";
import type { Database } from "@/db/schema";
import type { SessionUser } from "@/lib/auth/session-user";
import type { Operation } from "@/lib/sync/operations";
import { type Tablet } from "../../bench/sync-ops";
import { createShopFixture, type ShopFixture } from "./shop-fixture";

// A fixture shop whose mechanic works the first stage ("measure") of the bottom-end procedure on a
// simulated tablet and signs it off, the way the bench does it through POST /api/sync.

export const asUser = (u: ShopFixture["users"]["mechanic"]): SessionUser => ({ ...u, customerId: null });

export interface MeasureSpec {
  id: string;
  key: string;
  stepId: string;
  readings: number;
}

export async function reviewSetup(db: Kysely<Database>) {
  const fx = await createShopFixture(db);
  const stepIds = ["bore-cyl-1", "piston-clearance", "ring-gap", "main-clearance"].map((k) => fx.stepByKey[k].id);
  const specRows = await db
    .selectFrom("measurement_specs")
    .select(["id", "key", "step_id", "reading_labels"])
    .where("step_id", "in", stepIds)
    .execute();
  const specs: Record<string, MeasureSpec> = Object.fromEntries(
    specRows.map((s) => [s.key, { id: s.id, key: s.key, stepId: s.step_id, readings: Math.max(1, s.reading_labels.length) }]),
  );
  const users = {
    mech: asUser(fx.users.mechanic),
    mech2: asUser(fx.users.mechanic2),
    sup: asUser(fx.users.supervisor),
    office: asUser(fx.users.office),
    customer: { ...asUser(fx.users.customer), customerId: fx.customerId },
  };
  const stage = { jobProcedureId: fx.procedures[0].id, stageKey: "measure" };
  return { fx, specs, stepIds, users, stage };
}

/** In-tolerance values for every reading of the measure stage (mm). */
export const GOOD: Record<string, number> = {
  "bore-1": 76.005,
  "ptw-1": 0.06,
  "ptw-2": 0.061,
  "top-ring-gap": 0.41,
  "main-oil-clearance": 0.031,
};

/**
 * Operations that read every spot of the measure stage (with `override` values per "key:index"),
 * complete its four steps and sign it off.
 */
export function measureStageWork(
  tablet: Tablet,
  specs: Record<string, MeasureSpec>,
  stepIds: string[],
  stage: { jobProcedureId: string; stageKey: string },
  override: Record<string, number> = {},
) {
  const ops: Operation[] = [];
  for (const spec of Object.values(specs)) {
    for (let i = 0; i < spec.readings; i++) ops.push(tablet.read(spec.stepId, spec.id, i, override[`${spec.key}:${i}`] ?? GOOD[spec.key]));
  }
  for (const id of stepIds) ops.push(tablet.complete(id));
  const signOff = tablet.make("stage.signed-off", stage);
  ops.push(signOff);
  return { ops, signOff };
}

/** Sends a batch as `user` and keeps the tablet's cursor, like the bench's sync client. */
export async function sync(db: Kysely<Database>, user: SessionUser, tablet: Tablet, ops: Operation[] = []) {
  const r = await mergeBatch(db, user, tablet.batch(ops));
  tablet.cursor = r.cursor;
  return r;
}
