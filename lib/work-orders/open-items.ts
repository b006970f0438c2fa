/**
 * What is still open on a work order's record: the one definition read by the gates on the
 * moves to "ready" and "handed over", the office's checklist, the override record and the build
 * report. Worked out from the same stage view the bench and the build progress read
 * (lib/work-order-record/), the written acceptances of readings, and the flagged entries (any kind
 * of operation the sync kept and flagged, placed on its stage by lib/review/flagged-work.ts). Pure.
 *
 * Open, per stage of every pinned procedure:
 *   - a step not done, or sent back by the supervisor and not redone;
 *   - the stage not signed off, or signed off with no approving decision on that sign-off;
 *   - a current reading out of tolerance with no written acceptance;
 *   - a flagged entry with no written acceptance (one received after the stage was approved
 *     included: it puts the stage back in the review queue).
 * And, for the job as a whole: work a tablet handed over unsent when its session was ended
 * (db/auth/outbox-handovers.ts), until the office settles it with a written note.
 * A work order with no procedure pinned has one open item (and those): there is no record to review.
 */
import { readingLabelOf } from "@/lib/review/stage-review";
import { entryDetail, entryKindLabel, placeOfEntry, type FlaggedEntry, type PlaceLookup } from "@/lib/review/flagged-work";
import type { StageView } from "@/lib/work-order-record";

export const OPEN_ITEM_KINDS = [
  "no_procedure",
  "step_not_done",
  "sent_back_not_redone",
  "stage_not_signed_off",
  "sign_off_not_decided",
  "reading_not_accepted",
  "flagged_not_accepted",
  "handover_not_settled",
] as const;
export type OpenItemKind = (typeof OPEN_ITEM_KINDS)[number];

export interface OpenItem {
  /** Stable while the item stays open: the kind and what it is about. */
  key: string;
  kind: OpenItemKind;
  stage: { jobProcedureId: string; key: string; title: string; procedureName: string } | null;
  step: { id: string; title: string } | null;
  /** What is open, in workshop words. */
  reason: string;
  /** The sign-off a supervisor decides on to settle it (the review screen), when there is one. */
  signOffId: string | null;
}

/** Work a tablet handed over unsent when its session was ended, on this job, not settled by the office yet. */
export interface HandedOverWork {
  handoverId: string;
  entryCount: number;
  /** Photos taken on the job whose bytes never reached the server. */
  photoCount?: number;
  /** Who recorded it (the session's person). */
  by: string;
  deviceId: string;
}

export interface OpenItemFacts {
  /** The work order's stages as the bench and the office see them (no tablet work on top). */
  stages: readonly StageView[];
  /** Ids of readings a supervisor has let stand with a written reason. */
  acceptedReadingIds: ReadonlySet<string>;
  /** Every flagged entry of the work order, accepted ones included. */
  flagged: readonly FlaggedEntry[];
  lookup: PlaceLookup;
  /** Sign-off id → whether an approving decision stands on it (the latest decision on it is an approval). */
  approvedSignOffs: ReadonlySet<string>;
  /** Hand-overs of unsent work on this job the office has not settled. */
  handedOver?: readonly HandedOverWork[];
}

const stageKeyOf = (jobProcedureId: string, key: string) => `${jobProcedureId}|${key}`;

export function openItems(f: OpenItemFacts): OpenItem[] {
  const handedOver = (f.handedOver ?? []).map((h): OpenItem => ({
    key: `handover_not_settled:${h.handoverId}`,
    kind: "handover_not_settled",
    stage: null,
    step: null,
    reason:
      `${handedOverWhat(h)} recorded by ${h.by} on tablet ${h.deviceId} ` +
      `${h.entryCount + (h.photoCount ?? 0) === 1 ? "was" : "were"} handed over unsent when the session was ended: re-enter what belongs on the record, ` +
      "then settle the hand-over with a note on the Sign-ins page.",
    signOffId: null,
  }));
  if (f.stages.length === 0) {
    return [
      {
        key: "no_procedure",
        kind: "no_procedure",
        stage: null,
        step: null,
        reason: "No procedure is pinned on this work order: there is no build record to review.",
        signOffId: null,
      },
      ...handedOver,
    ];
  }
  const items: OpenItem[] = [];
  const flaggedByStage = new Map<string, OpenItem[]>();
  const stepTitles = new Map(f.stages.flatMap((s) => s.steps.map((st) => [st.step.id, st.step.title] as const)));
  const stageInfo = new Map(f.stages.map((s) => [stageKeyOf(s.jobProcedureId, s.key), s]));
  const standingSignOffOf = (s: StageView | undefined) => (s?.signedOff && !s.signedOff.pending ? s.signedOff.id : null);
  const anySignOff = f.stages.map(standingSignOffOf).find((id) => id !== null) ?? null;
  const onNoStage: OpenItem[] = [];

  for (const e of f.flagged) {
    if (e.acceptance) continue;
    const place = placeOfEntry(e, f.lookup);
    const stage = place.stage ? stageInfo.get(stageKeyOf(place.stage.jobProcedureId, place.stage.stageKey)) : undefined;
    const detail = entryDetail(e.kind, e.payload);
    const item: OpenItem = {
      key: `${FLAGGED_PREFIX}${e.operationId}`,
      kind: "flagged_not_accepted",
      stage: stage ? stageOf(stage) : null,
      step: place.stepId && stepTitles.has(place.stepId) ? { id: place.stepId, title: stepTitles.get(place.stepId)! } : null,
      reason: `${entryKindLabel(e.kind)}${detail ? ` (${detail})` : ""} flagged and not accepted: ${e.flagReason}`,
      signOffId: stage ? standingSignOffOf(stage) : anySignOff,
    };
    if (stage) {
      const k = stageKeyOf(stage.jobProcedureId, stage.key);
      flaggedByStage.set(k, [...(flaggedByStage.get(k) ?? []), item]);
    } else onNoStage.push(item);
  }

  for (const stage of f.stages) {
    const where = stageOf(stage);
    const signOffId = standingSignOffOf(stage);
    for (const sv of stage.steps) {
      const step = { id: sv.step.id, title: sv.step.title };
      if (sv.reopened) {
        items.push({
          key: `sent_back_not_redone:${sv.step.id}`,
          kind: "sent_back_not_redone",
          stage: where,
          step,
          reason: `Sent back by the supervisor (“${sv.reopened.reason}”) and not redone yet.`,
          signOffId: null,
        });
      } else if (!sv.done) {
        items.push({
          key: `step_not_done:${sv.step.id}`,
          kind: "step_not_done",
          stage: where,
          step,
          reason: sv.missing.length ? `Not done yet: ${sv.missing.join("; ")}.` : "Not done yet.",
          signOffId: null,
        });
      }
      for (const spec of sv.step.measurementSpecs) {
        for (const r of sv.current.get(spec.id)?.values() ?? []) {
          if (r.verdict === "in" || f.acceptedReadingIds.has(r.id)) continue;
          const label = spec.readingLabels.length ? `${spec.label}, ${readingLabelOf(spec.readingLabels, r.readingIndex)}` : spec.label;
          items.push({
            key: `reading_not_accepted:${r.id}`,
            kind: "reading_not_accepted",
            stage: where,
            step,
            reason: `Reading out of tolerance and not let stand by the supervisor: ${label} ${r.value} ${r.unit} (${r.verdict === "high" ? "above" : "below"} the limits ${spec.min} to ${spec.max} ${spec.unit}).`,
            signOffId,
          });
        }
      }
    }
    if (!stage.signedOff || stage.signedOff.pending) {
      items.push({
        key: `stage_not_signed_off:${stage.jobProcedureId}:${stage.key}`,
        kind: "stage_not_signed_off",
        stage: where,
        step: null,
        reason: stage.allDone ? "Every step is done, but the stage is not signed off." : "The stage is not signed off.",
        signOffId: null,
      });
    } else if (!f.approvedSignOffs.has(stage.signedOff.id)) {
      items.push({
        key: `sign_off_not_decided:${stage.signedOff.id}`,
        kind: "sign_off_not_decided",
        stage: where,
        step: null,
        reason: "Signed off, but no supervisor has approved it yet.",
        signOffId: stage.signedOff.id,
      });
    }
    items.push(...(flaggedByStage.get(stageKeyOf(stage.jobProcedureId, stage.key)) ?? []));
  }
  return [...items, ...onNoStage, ...handedOver];
}

/** "2 entries", "1 photo not uploaded", "2 entries and 1 photo not uploaded". */
export function handedOverWhat(h: { entryCount: number; photoCount?: number }): string {
  const photos = h.photoCount ?? 0;
  const parts = [
    h.entryCount > 0 ? (h.entryCount === 1 ? "1 entry" : `${h.entryCount} entries`) : "",
    photos > 0 ? `${photos === 1 ? "1 photo" : `${photos} photos`} not uploaded` : "",
  ].filter(Boolean);
  return parts.join(" and ");
}

function stageOf(s: StageView): NonNullable<OpenItem["stage"]> {
  return { jobProcedureId: s.jobProcedureId, key: s.key, title: s.title, procedureName: s.procedureName };
}

const COUNT_WORDS: Record<OpenItemKind, [string, string]> = {
  no_procedure: ["no procedure pinned", "no procedure pinned"],
  step_not_done: ["step not done", "steps not done"],
  sent_back_not_redone: ["step sent back and not redone", "steps sent back and not redone"],
  stage_not_signed_off: ["stage not signed off", "stages not signed off"],
  sign_off_not_decided: ["sign-off not approved", "sign-offs not approved"],
  reading_not_accepted: ["reading out of tolerance not let stand", "readings out of tolerance not let stand"],
  flagged_not_accepted: ["flagged entry not accepted", "flagged entries not accepted"],
  handover_not_settled: ["hand-over of unsent work not settled", "hand-overs of unsent work not settled"],
};

/** "3 steps not done, 1 sign-off not approved": the open items counted by kind, in the order of OPEN_ITEM_KINDS. */
export function openItemsSummary(items: readonly OpenItem[]): string {
  if (items.length === 0) return "nothing open";
  return OPEN_ITEM_KINDS.map((k) => [k, items.filter((i) => i.kind === k).length] as const)
    .filter(([, n]) => n > 0)
    .map(([k, n]) => `${n} ${COUNT_WORDS[k][n === 1 ? 0 : 1]}`)
    .join(", ");
}

const FLAGGED_PREFIX = "flagged_not_accepted:";

/**
 * The flagged entry an open item is about, when it is accepted on its own rather than with a
 * review decision: on a closed job, with no sign-off that can carry it (its stage's withdrawn or
 * never made). Null for every other item: those are settled on the review screen or at the bench.
 */
export function entryAcceptedOnItsOwn(item: Pick<OpenItem, "key" | "kind" | "signOffId">, jobClosed: boolean): string | null {
  if (item.kind !== "flagged_not_accepted" || item.signOffId || !jobClosed || !item.key.startsWith(FLAGGED_PREFIX)) return null;
  return item.key.slice(FLAGGED_PREFIX.length);
}

/** One line per item, as the report and the e-mail print it: "Bottom end › Main bearings: Not done yet." */
export function openItemLine(i: Pick<OpenItem, "stage" | "step" | "reason">): string {
  const where = [i.stage?.title, i.step?.title].filter(Boolean).join(" › ");
  return where ? `${where}: ${i.reason}` : i.reason;
}

/** The same list of open items? (the override names the list the office saw; a changed list is refused). */
export function sameOpenItems(items: readonly OpenItem[], seenKeys: readonly string[]): boolean {
  const now = new Set(items.map((i) => i.key));
  const seen = new Set(seenKeys);
  return now.size === seen.size && [...now].every((k) => seen.has(k));
}
