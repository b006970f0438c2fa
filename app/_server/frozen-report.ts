import "server-only";
import { createHash } from "node:crypto";
import {
  acceptedBasis,
  handoverOf,
  insertReportRevision,
  lateEntriesAwaiting,
  reportRevision,
  withReportLock,
} from "@/db/records/report-revisions";
import type { Db } from "@/db/setup/client";
import { Refusal } from "@/lib/errors";
import { revisionChanges } from "@/lib/report/revision-changes";
import { currentReportLines, renderBuildReport } from "./handover-report";
import { getObject, putObject } from "./object-store";

// The build report as handed over never changes under the customer: at handover it is rendered
// once, stored in object storage, and its SHA-256 kept in the database (revision 1). A later
// accepted change on the closed job (a supervisor's decision, a dyno run withdrawn) makes a new
// numbered revision listing what changed; every stored copy stays as it was. The customer's link
// serves the stored bytes.

export const sha256Hex = (bytes: Uint8Array) => createHash("sha256").update(bytes).digest("hex");

async function storeCopy(
  trx: Db,
  c: { shopId: string; workOrderId: string; revision: number; handedOverAt: Date; changes: string[]; madeBy: string | null },
) {
  const { pdf, lines } = await renderBuildReport(trx, c.shopId, c.workOrderId, {
    number: c.revision,
    handedOverAt: c.handedOverAt,
    changes: c.changes,
  });
  const sha256 = sha256Hex(pdf);
  const objectKey = `reports/${c.shopId}/${c.workOrderId}/revision-${c.revision}-${sha256}.pdf`;
  // Stored before the row is written: a failed upload rolls the caller's transaction back.
  await putObject(objectKey, pdf, "application/pdf");
  await insertReportRevision(trx, {
    shopId: c.shopId,
    workOrderId: c.workOrderId,
    revision: c.revision,
    objectKey,
    sha256,
    byteSize: pdf.length,
    lines,
    changes: c.changes,
    basis: await acceptedBasis(trx, c.workOrderId),
    madeBy: c.madeBy,
  });
  return { revision: c.revision, sha256, byteSize: pdf.length };
}

/**
 * The build report as the record stood when the job passed the gate to "ready": rendered inside the
 * move's own transaction (under the shop's sync lock, where the gate read the record) and stored;
 * the "ready to collect" e-mail attaches these bytes, whatever the bench sends before it goes out.
 * Returns the object's key. A failed upload rolls the move back.
 */
export async function storeReadyCopy(trx: Db, shopId: string, workOrderId: string): Promise<string> {
  const { pdf } = await renderBuildReport(trx, shopId, workOrderId);
  const key = `reports/${shopId}/${workOrderId}/ready-${Date.now()}-${sha256Hex(pdf)}.pdf`;
  await putObject(key, pdf, "application/pdf");
  return key;
}

/** Stores revision 1, inside the handover's own transaction (after the move, so it prints "Handed over"). */
export async function storeHandoverCopy(trx: Db, shopId: string, workOrderId: string, madeBy: string) {
  return storeCopy(trx, { shopId, workOrderId, revision: 1, handedOverAt: new Date(), changes: [], madeBy });
}

/**
 * Brings a handed-over job's stored copies up to date: when an accepted change has come in since
 * the latest copy and the report now prints differently, a new revision is stored, listing what
 * changed; not while entries received after the handover wait for the supervisor's acceptance. A job handed over before copies were kept gets its revision 1 now. Returns the new
 * revision's number, or null when nothing was stored. Safe to call from anywhere, any number of
 * times (one copy is made at a time per job).
 */
export async function reviseStoredReport(db: Db, shopId: string, workOrderId: string, madeBy: string | null): Promise<number | null> {
  return withReportLock(db, workOrderId, async (trx) => {
    const job = await handoverOf(trx, shopId, workOrderId);
    if (!job || job.status !== "handed_over") return null;
    const handedOverAt = job.handedOverAt ?? job.closedAt ?? new Date();
    const latest = await reportRevision(trx, shopId, workOrderId, null);
    if (!latest) {
      const note = `Stored on ${new Date().toISOString().slice(0, 10)}: this job was handed over before Benchtag kept copies of its reports.`;
      return (await storeCopy(trx, { shopId, workOrderId, revision: 1, handedOverAt, changes: [note], madeBy })).revision;
    }
    if (latest.basis === (await acceptedBasis(trx, workOrderId))) return null;
    // A revision prints the record as accepted: while work received after the handover waits for
    // the supervisor, it would print that work as the record, so the revision waits with it (the
    // acceptance is itself an accepted change: the revision is made then, with every change since).
    if ((await lateEntriesAwaiting(trx, workOrderId, new Date(handedOverAt))) > 0) return null;
    const changes = revisionChanges(latest.lines, (await currentReportLines(trx, shopId, workOrderId)) ?? []);
    if (changes.length === 0) return null;
    return (await storeCopy(trx, { shopId, workOrderId, revision: latest.revision + 1, handedOverAt, changes, madeBy })).revision;
  });
}

/** The stored bytes of one copy (the latest when `revision` is null), checked against their SHA-256; null when there is none. */
export async function storedReport(db: Db, shopId: string, workOrderId: string, revision: number | null) {
  const r = await reportRevision(db, shopId, workOrderId, revision);
  if (!r) return null;
  const { body } = await getObject(r.objectKey);
  if (sha256Hex(body) !== r.sha256) {
    throw new Refusal("The stored build report did not read back intact; nothing was changed. Tell the workshop.", 503);
  }
  return { bytes: body, sha256: r.sha256, revision: r.revision, handedOver: r.handedOver };
}

/**
 * After an accepted change on a closed job (a decision, a withdrawn dyno run): a new revision now.
 * The change itself is already committed; if storing fails, the next read of the report makes the
 * revision, so this never fails the request.
 */
export async function reviseAfterAcceptedChange(
  db: Db,
  shopId: string,
  workOrderId: string,
  userId: string | null,
): Promise<number | null> {
  try {
    return await reviseStoredReport(db, shopId, workOrderId, userId);
  } catch (e) {
    console.error("[report] the build report's new revision waits for the next read:", e instanceof Error ? e.message : e);
    return null;
  }
}
