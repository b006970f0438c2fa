import "server-only";
import type { Kysely } from "kysely";
import { buildWorkOrderView } from "@/lib/work-order-record";
import { openItems, type OpenItem } from "@/lib/work-orders/open-items";
import { unsettledHandoversOf } from "../auth/outbox-handovers";
import { getJobSnapshot } from "../bench/jobs";
import { flaggedEntriesOf, placeLookups } from "../review/flagged-work";
import type { Database } from "../schema";

// What is still open on a work order's record (lib/work-orders/open-items.ts), read from the
// database: the job's stage view, the written acceptances of readings, the flagged entries and
// the hand-overs of unsent tablet work not settled yet.
// Inside a transaction it reads there, so the gate sees what the move's own transaction sees.

/** The open items of one work order of the shop; null when the work order is not the shop's. */
export async function loadOpenItems(db: Kysely<Database>, shopId: string, workOrderId: string): Promise<OpenItem[] | null> {
  const snapshot = await getJobSnapshot(db, { id: "", shopId, role: "office" }, workOrderId);
  if (!snapshot) return null;
  const [accepted, flagged, handedOver] = await Promise.all([
    db
      .selectFrom("reading_acceptances as a")
      .innerJoin("measurements as m", "m.id", "a.measurement_id")
      .select("a.measurement_id")
      .where("m.work_order_id", "=", workOrderId)
      .where("a.shop_id", "=", shopId)
      .execute(),
    flaggedEntriesOf(db, shopId, [workOrderId]),
    unsettledHandoversOf(db, shopId, workOrderId),
  ]);
  const lookups = await placeLookups(db, flagged);
  const view = buildWorkOrderView(snapshot, [], Date.now());
  return openItems({
    stages: view.stages,
    acceptedReadingIds: new Set(accepted.map((a) => a.measurement_id)),
    flagged: flagged.get(workOrderId) ?? [],
    lookup: lookups.get(workOrderId) ?? { stageOfStep: new Map(), stepOfTimer: new Map(), operations: new Map() },
    approvedSignOffs: new Set(snapshot.state.reviewDecisions.filter((d) => d.decision === "approved").map((d) => d.signOffId)),
    handedOver,
  });
}
