import "server-only";
import type { Kysely } from "kysely";
import type { TuneFields, TuneVersion } from "@/lib/dyno/tune-version";
import { CHECK_THE_FIELDS, Refusal } from "@/lib/errors";
import { appendAudit } from "../audit/append";
import type { Database } from "../schema";
import { holdKeys } from "../setup/key-locks";
import { withOpenRecord } from "../shop/open-record";

// Tune versions of a work order (lib/dyno/tune-version.ts). Rows are append-only (a trigger refuses
// changes); the bytes live in object storage under `object_key`.

/** The work order's tune versions, oldest first. */
export async function listTuneVersions(db: Kysely<Database>, shopId: string, workOrderId: string): Promise<TuneVersion[]> {
  const rows = await db
    .selectFrom("tune_versions as t")
    .innerJoin("users as u", "u.id", "t.uploaded_by")
    .select(["t.id", "t.label", "t.notes", "t.file_name", "t.size_bytes", "t.sha256", "u.name as uploadedBy", "t.uploaded_at"])
    .where("t.shop_id", "=", shopId)
    .where("t.work_order_id", "=", workOrderId)
    .orderBy("t.uploaded_at")
    .orderBy("t.id")
    .execute();
  return rows.map((r) => ({
    id: r.id,
    label: r.label,
    notes: r.notes,
    fileName: r.file_name,
    sizeBytes: r.size_bytes,
    sha256: r.sha256,
    uploadedBy: r.uploadedBy,
    uploadedAt: r.uploaded_at.toISOString(),
  }));
}

/** One tune version with where its bytes are, or null when it is not this work order's. */
export async function findTuneFile(db: Kysely<Database>, shopId: string, workOrderId: string, tuneId: string) {
  return (
    (await db
      .selectFrom("tune_versions")
      .select([
        "id",
        "label",
        "file_name as fileName",
        "content_type as contentType",
        "size_bytes as sizeBytes",
        "sha256",
        "object_key as objectKey",
      ])
      .where("shop_id", "=", shopId)
      .where("work_order_id", "=", workOrderId)
      .where("id", "=", tuneId)
      .executeTakeFirst()) ?? null
  );
}

/** Refuses a label the work order already has (before the bytes are stored). */
export async function checkTuneLabelFree(db: Kysely<Database>, shopId: string, workOrderId: string, label: string): Promise<void> {
  const taken = await db
    .selectFrom("tune_versions")
    .select("id")
    .where("shop_id", "=", shopId)
    .where("work_order_id", "=", workOrderId)
    .where("label", "=", label)
    .executeTakeFirst();
  if (taken) {
    throw new Refusal(CHECK_THE_FIELDS, 409, [
      { path: "label", message: `This work order already has a tune labelled “${label}”: give the new version its own label.` },
    ]);
  }
}

/** Records a stored tune file as a new version, with its audit entry, in one transaction. */
export async function recordTuneVersion(
  db: Kysely<Database>,
  user: { id: string; shopId: string },
  workOrderId: string,
  tune: TuneFields & { id: string; fileName: string; contentType: string; sizeBytes: number; sha256: string; objectKey: string },
): Promise<string> {
  // on an open record only (a handover waits for this, or this sees it), and the label checked and
  // written one upload at a time (a double click on Upload)
  return withOpenRecord(db, { shopId: user.shopId, userId: user.id }, workOrderId, "tune version", async (trx) => {
    await holdKeys(trx, [`tune-label:${workOrderId}:${tune.label}`]);
    await checkTuneLabelFree(trx, user.shopId, workOrderId, tune.label);
    await trx
      .insertInto("tune_versions")
      .values({
        id: tune.id,
        shop_id: user.shopId,
        work_order_id: workOrderId,
        label: tune.label,
        notes: tune.notes,
        file_name: tune.fileName,
        content_type: tune.contentType,
        size_bytes: tune.sizeBytes,
        sha256: tune.sha256,
        object_key: tune.objectKey,
        uploaded_by: user.id,
      })
      .execute();
    await appendAudit(trx, [
      {
        shopId: user.shopId,
        actorId: user.id,
        action: "dyno.tune-uploaded",
        entity: "tune_version",
        entityId: tune.id,
        workOrderId,
        outcome: "accepted",
        detail: { label: tune.label, fileName: tune.fileName, sizeBytes: tune.sizeBytes, sha256: tune.sha256 },
      },
    ]);
    return tune.id;
  });
}
