"use client";

import type { BenchDb } from "@/lib/client/bench-db";
import { refreshJobCopy } from "@/lib/client/sync-client";
import { handedOverMessage } from "@/lib/aftercare/come-backs";
import { handedOverLookupSchema, tagLookupSchema } from "@/lib/sync/snapshot";

/** A failed look-up; for a handed-over bike, the job a come-back may be opened from (office and supervisors only). */
export type TagResult =
  { ok: true; jobId: string } | { ok: false; message: string; comeBackFrom?: { workOrderId: string; number: number } };

export function normaliseTag(raw: string): string {
  return raw.trim().toUpperCase().replace(/\s+/g, "");
}

/** Finds a bike's open job by tag: on this tablet first (works offline), then on the server. */
export async function lookUpTag(db: BenchDb, raw: string): Promise<TagResult> {
  const code = normaliseTag(raw);
  if (!code) return { ok: false, message: "Enter a tag code." };
  const listed = (await db.jobList.toArray()).find((j) => j.bike.tagCode.toUpperCase() === code);
  if (listed) return { ok: true, jobId: listed.id };
  const stored = (await db.jobs.toArray()).find((j) => j.snapshot.bike.tagCode.toUpperCase() === code);
  if (stored) return { ok: true, jobId: stored.id };
  if (!navigator.onLine) return { ok: false, message: `Tag ${code} is not on this tablet, and there is no network to look it up.` };
  const res = await fetch(`/api/bench/tags/${encodeURIComponent(code)}`, { cache: "no-store" });
  if (res.status === 404) {
    const body = (await res.json().catch(() => ({}))) as { error?: string };
    return { ok: false, message: body.error ?? `No bike with tag ${code} in this shop.` };
  }
  if (!res.ok) return { ok: false, message: `Could not look up tag ${code} (HTTP ${res.status}).` };
  const body: unknown = await res.json();
  const handed = handedOverLookupSchema.safeParse(body);
  if (handed.success) {
    const h = handed.data.handedOver;
    return {
      ok: false,
      message: handedOverMessage(h),
      comeBackFrom: h.canOpenComeBack ? { workOrderId: h.workOrderId, number: h.number } : undefined,
    };
  }
  const found = tagLookupSchema.parse(body);
  await refreshJobCopy(db, found.workOrderId);
  return { ok: true, jobId: found.workOrderId };
}
