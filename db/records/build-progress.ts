import "server-only";
import type { Kysely } from "kysely";
import type { SessionUser } from "@/lib/auth/session-user";
import { buildWorkOrderView } from "@/lib/work-order-record";
import { buildProgress, type BuildProgress } from "@/lib/work-orders/build-progress";
import { getJobSnapshot } from "../bench/jobs";
import type { Database } from "../schema";

/** The build's progress by stage, from the job's synced bench record; null when not in the user's shop. */
export async function loadBuildProgress(db: Kysely<Database>, user: SessionUser, workOrderId: string): Promise<BuildProgress | null> {
  const snapshot = await getJobSnapshot(db, user, workOrderId);
  if (!snapshot) return null;
  const view = buildWorkOrderView(snapshot, [], Date.now());
  return buildProgress(view.stages, snapshot.workOrder.status);
}
