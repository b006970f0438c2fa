import "server-only";
import { sql, type Kysely } from "kysely";
import type { SessionUser } from "@/lib/auth/session-user";
import { buildSnapshotDelta, sectionDigests, snapshotDigest, type SnapshotDelta } from "@/lib/sync/snapshot-delta";
import type { JobSnapshot } from "@/lib/sync/snapshot";
import type { Database } from "../schema";
import { getJobSnapshot } from "./jobs";

// A job's copy for a tablet that may hold an earlier one (lib/sync/snapshot-delta.ts): the same
// copy, unchanged (with the cursor it is current to), only what changed since the tablet's copy,
// or the whole copy. Read in one consistent snapshot with the record.

export type JobCopy =
  | { kind: "unchanged"; cursor: string; digest: string }
  | { kind: "delta"; delta: SnapshotDelta; digest: string }
  | { kind: "full"; snapshot: JobSnapshot; digest: string };

/** What the tablet holds: the cursor of its copy and its sections' digests. */
export interface HeldCopy {
  since?: string;
  have?: string[];
}

export async function jobCopyFor(
  db: Kysely<Database>,
  user: Pick<SessionUser, "id" | "shopId" | "role">,
  jobId: string,
  held: HeldCopy,
): Promise<JobCopy | null> {
  return db
    .transaction()
    .setIsolationLevel("repeatable read")
    .execute(async (trx) => {
      const snapshot = await getJobSnapshot(trx, user, jobId);
      if (!snapshot) return null;
      const digests = await sectionDigests(snapshot);
      const digest = await snapshotDigest(digests);
      const heldDigest = held.have ? await snapshotDigest(held.have) : null;
      if (heldDigest === digest) return { kind: "unchanged", cursor: snapshot.cursor, digest };
      if (held.since === undefined || !held.have || BigInt(held.since) > BigInt(snapshot.cursor)) return { kind: "full", snapshot, digest };
      const since = BigInt(held.since);
      const ops = await sql<{ id: string }>`
        SELECT id FROM operations WHERE shop_id = ${user.shopId}::uuid AND seq > ${held.since}::bigint AND work_order_id = ${jobId}::uuid
      `.execute(trx);
      const delta = await buildSnapshotDelta(snapshot, digests, held.have, { since, operationIds: new Set(ops.rows.map((o) => o.id)) });
      return { kind: "delta", delta, digest };
    });
}
