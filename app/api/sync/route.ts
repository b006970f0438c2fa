import { handOnReviewNotices } from "@/app/_server/queue/boss";
import { json, route } from "@/app/_server/route";
import { mergeBatch } from "@/db/sync/merge";
import { Refusal } from "@/lib/errors";
import { SYNC_LIMITS, syncEnvelopeSchema } from "@/lib/sync/operations";
import { parseBatch } from "@/lib/sync/parse-batch";

// POST /api/sync: a tablet's outbox batch in, outcomes and changes from elsewhere out.
// The format and rules are in lib/sync (README.md there); the merge is db/sync/merge.ts.
//   401 not signed in · 403 role cannot reach the bench, or not from our pages · 415 not JSON ·
//   413 body or batch too large · 400 body not JSON (or not UTF-8) · 422 the batch's envelope
//   (device, cursor, list of operations) does not match the format (issues: path + message) ·
//   503 the database did not answer and nothing from the batch was saved (send it again) ·
//   200 the merge result. Each operation is checked on its own (lib/sync/parse-batch.ts): a
//   malformed one is refused alone, with its reason, and the rest are merged.
// After a merge has committed, the supervisors' e-mail for new sign-offs is sent (the notices were
// stored by the merge itself; see db/review/notices.ts), outside the response's time.
const batch = json(syncEnvelopeSchema, {
  maxBytes: SYNC_LIMITS.maxBodyBytes,
  tooLargeHint: "Send the outbox in smaller batches.",
  // each operation is checked on its own (a text it cannot store refuses that operation alone)
  anyText: true,
  emptyMessage: "The body is empty: send a JSON batch { deviceId, cursor, operations }.",
  invalid: { status: 422, error: "The batch does not match the sync format; nothing was saved." },
  before: (raw) => {
    const ops = (raw as { operations?: unknown } | null)?.operations;
    if (Array.isArray(ops) && ops.length > SYNC_LIMITS.maxOperations) {
      throw new Refusal(
        `The batch has ${ops.length} operations; the limit is ${SYNC_LIMITS.maxOperations}. Send the outbox in smaller batches.`,
        413,
      );
    }
  },
});

export const POST = route({ access: { area: "bench" }, body: batch }, async ({ user, body, db, later }) => {
  const result = await mergeBatch(db, user, parseBatch(body));
  // The sign-off notices the merge stored become supervisor e-mails in a queue job (the sweep catches any missed).
  later(() => handOnReviewNotices().catch((e) => console.error("[review] notice job not queued; the sweep will run it", e)));
  return result;
});
