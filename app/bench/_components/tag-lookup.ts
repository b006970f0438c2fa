"use client";

import type { BenchDb } from "@/lib/client/bench-db";
import { refreshJobCopy } from "@/lib/client/sync-client";
import { tagLookupSchema } from "@/lib/sync/snapshot";

export type TagResult = { ok: true; jobId: string } | { ok: false; message: string };

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
  const found = tagLookupSchema.parse(await res.json());
  await refreshJobCopy(db, found.workOrderId);
  return { ok: true, jobId: found.workOrderId };
}
