"use client";

import { useEffect, useState } from "react";
import type { StepView } from "@/lib/work-order-record";
import { photosOfStep, recordPhoto } from "@/lib/client/bench-store";
import { notSavedText } from "@/lib/client/not-saved-words";
import { PHOTO_CONTENT_TYPES } from "@/lib/sync/operations";
import type { JobSnapshot } from "@/lib/sync/snapshot";
import { useAuthor, useBench } from "./bench-context";
import { useLive } from "./use-live";
import { WithdrawEntry } from "./withdraw-entry";

/** Take or pick a photo at a step. Kept in IndexedDB until it is sent with the next sync. */
export function PhotoPanel({
  jobId,
  view,
  snapshotPhotos,
}: {
  jobId: string;
  view: StepView;
  snapshotPhotos: JobSnapshot["state"]["photos"];
}) {
  const { db, syncNow } = useBench();
  const author = useAuthor();
  const [error, setError] = useState<string | null>(null);
  const photos = useLive(() => photosOfStep(db, jobId, view.step.id), [db, jobId, view.step.id], []);
  // photos whose entry the server did not store: kept here, listed under "not stored"
  const notStored = useLive(
    () =>
      db.outbox
        .where("workOrderId")
        .equals(jobId)
        .filter((o) => o.op?.kind === "photo.queued" && (o.state === "refused" || o.state === "discarding"))
        .toArray()
        .then((rows) => new Set(rows.map((o) => (o.op.kind === "photo.queued" ? o.op.payload.attachmentId : "")))),
    [db, jobId],
    new Set<string>(),
  );
  const localIds = new Set(photos.map((p) => p.id));
  const entry = new Map(view.photos.map((p) => [p.attachmentId, p]));
  /** The photo's state line and, unless withdrawn, its withdraw button. */
  const withdrawOf = (attachmentId: string) => {
    const p = entry.get(attachmentId);
    if (!p) return null;
    return p.withdrawn ? (
      <span className="block text-sm font-bold text-fail" data-testid="photo-withdrawn">
        ⊘ withdrawn: “{p.withdrawn.reason}”
      </span>
    ) : (
      <WithdrawEntry jobId={jobId} operationId={p.operationId} recordedBy={p.takenBy} what="this photo" />
    );
  };
  // Photos whose bytes are not on this tablet: taken on another one, or sent and since cleared here.
  const others = snapshotPhotos.filter((p) => p.stepId === view.step.id && !localIds.has(p.id));
  const [urls, setUrls] = useState<Array<{ id: string; url: string; uploaded: boolean; refusedReason?: string }>>([]);
  useEffect(() => {
    const made = photos.map((p) => ({
      id: p.id,
      url: URL.createObjectURL(p.blob),
      uploaded: p.uploaded === 1,
      refusedReason: p.refusedReason,
    }));
    setUrls(made);
    return () => made.forEach((m) => URL.revokeObjectURL(m.url));
  }, [photos]);

  async function onFile(file: File | undefined) {
    setError(null);
    if (!file) return;
    if (!(PHOTO_CONTENT_TYPES as readonly string[]).includes(file.type)) {
      setError(`That file is ${file.type || "of an unknown type"}; take a JPEG, PNG or WebP photo.`);
      return;
    }
    try {
      await recordPhoto(db, author, jobId, {
        stepId: view.step.id,
        blob: file,
        contentType: file.type as (typeof PHOTO_CONTENT_TYPES)[number],
      });
    } catch (e) {
      setError(notSavedText(e));
      return;
    }
    syncNow();
  }

  return (
    <section aria-label="Photos" className="rounded-xl border-4 border-steel-700 bg-white p-4">
      <h3 className="text-2xl font-bold">Photos{view.step.requiresPhoto ? " (at least one needed)" : ""}</h3>
      <label className="mt-2 flex min-h-target cursor-pointer items-center justify-center rounded-xl border-4 border-steel-900 bg-steel-900 px-5 text-xl font-bold text-white">
        Take or add a photo
        <input
          type="file"
          accept="image/*"
          capture="environment"
          className="sr-only"
          onChange={(e) => void onFile(e.target.files?.[0])}
          data-testid="photo-input"
        />
      </label>
      {error && (
        <p role="alert" className="mt-2 text-lg font-bold text-fail">
          {error}
        </p>
      )}
      <ul className="mt-3 flex flex-wrap gap-3">
        {urls.map((u) => (
          <li key={u.id} className="flex flex-col items-center gap-1 text-center">
            {/* eslint-disable-next-line @next/next/no-img-element */}
            <img
              src={u.url}
              alt="Step photo"
              className={`h-28 w-28 rounded-lg border-2 border-steel-700 object-cover ${entry.get(u.id)?.withdrawn ? "opacity-40" : ""}`}
            />
            {notStored.has(u.id) ? (
              <span className="max-w-28 text-sm font-bold text-fail" data-testid="photo-not-stored">
                ✖ not stored: see the list
              </span>
            ) : u.refusedReason && !u.uploaded ? (
              <span className="max-w-28 text-sm font-bold text-fail" data-testid="photo-not-sent">
                ✖ not sent: {u.refusedReason}
              </span>
            ) : (
              <span className="text-sm">{u.uploaded ? "sent" : "on tablet"}</span>
            )}
            {withdrawOf(u.id)}
          </li>
        ))}
      </ul>
      {others.length > 0 && (
        <ul className="mt-3 flex flex-wrap gap-3" aria-label="Photos kept on the server">
          {others.map((p) => (
            <li key={p.id} className="flex flex-col items-center gap-1 text-center">
              {p.awaitingUpload ? (
                <span className="flex h-28 w-28 items-center justify-center rounded-lg border-2 border-dashed border-steel-700 p-2 text-sm">
                  still on the tablet that took it
                </span>
              ) : (
                // eslint-disable-next-line @next/next/no-img-element
                <img
                  src={`/api/bench/photos/${p.id}`}
                  alt="Step photo (kept on the server)"
                  className="h-28 w-28 rounded-lg border-2 border-steel-700 object-cover"
                />
              )}
              {withdrawOf(p.id)}
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
