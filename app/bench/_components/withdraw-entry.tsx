"use client";

import { recordOperation } from "@/lib/client/bench-store";
import { useAuthor, useBench } from "./bench-context";
import { ReasonAction } from "./reason-action";

/**
 * Withdraw one of the bench's own entries (a bolt, a step completion, a part, a photo, a
 * sign-off) with a reason: a new `entry.withdrawn` operation naming it. Shown to the person who
 * recorded it and to supervisors; the server refuses anyone else.
 */
export function WithdrawEntry({
  jobId,
  operationId,
  recordedBy,
  what,
  testId = "withdraw",
}: {
  jobId: string;
  operationId: string | null | undefined;
  recordedBy: string | null;
  /** What it is, e.g. "bolt 3, pass 2". */
  what: string;
  testId?: string;
}) {
  const { db, user, syncNow } = useBench();
  const author = useAuthor();
  if (!operationId || (recordedBy !== user.id && user.role !== "supervisor")) return null;
  return (
    <ReasonAction
      open={`Withdraw ${what}…`}
      title={`Withdraw ${what}? It stays on the record, marked withdrawn with your reason, and no longer counts.`}
      confirm={`Withdraw ${what}`}
      testId={testId}
      onConfirm={async (reason) => {
        await recordOperation(db, author, jobId, "entry.withdrawn", { operationId, reason });
        syncNow();
      }}
    />
  );
}
