"use client";

import { useMutation } from "@tanstack/react-query";
import { useState } from "react";
import type { ReplyOf } from "@/app/_server/route";
import type { POST } from "@/app/api/office/work-orders/[id]/status/route";
import { api, ApiError, type Wire } from "@/app/ui/api-client";
import { OVERRIDE_REASON_MIN } from "@/lib/office/schemas";
import { openItemsSummary } from "@/lib/work-orders/open-items";
import { STATUS_LABELS, type WorkOrderStatus } from "@/lib/work-orders/status";
import type { WorkOrderData } from "./types";

type Moved = Wire<ReplyOf<typeof POST>>;

/**
 * The office's override of the gate on "ready" or "handed over": the move goes through with the
 * items open only with a written reason, sent with the list of open items on this screen (a list
 * that changed meanwhile is refused). The reason, who, when and those items go on record, on the
 * build report's first page and in the customer's e-mail.
 */
export function OverrideForm({
  workOrderId,
  to,
  items,
  note,
  onDone,
}: {
  workOrderId: string;
  to: WorkOrderStatus;
  items: WorkOrderData["openItems"];
  note: string;
  onDone: (r: Moved) => void;
}) {
  const [reason, setReason] = useState("");
  const [problem, setProblem] = useState<string | null>(null);
  const send = useMutation({
    mutationFn: () =>
      api<Moved>("POST", `/api/office/work-orders/${workOrderId}/status`, {
        to,
        note,
        override: { reason, openItemKeys: items.map((i) => i.key) },
      }),
    onSuccess: onDone,
    onError: (e) => {
      const field = e instanceof ApiError ? e.issues.find((i) => i.path.startsWith("override")) : undefined;
      setProblem(field?.message ?? (e as Error).message);
    },
  });
  return (
    <form
      className="mt-4 rounded-xl border-4 border-warn bg-warn-light p-4"
      data-testid="override-form"
      onSubmit={(e) => {
        e.preventDefault();
        setProblem(null);
        send.mutate();
      }}
    >
      <h3 className="text-xl font-bold">
        <span aria-hidden="true">⚠</span> Move to “{STATUS_LABELS[to]}” with items open?
      </h3>
      <p className="mt-1 text-lg">
        Open now: {openItemsSummary(items)} (listed under “Still open on the record”). Only with a written reason: it is kept with your
        name, printed on the first page of the build report and told to the customer.
      </p>
      <label className="mt-3 flex flex-col gap-1 text-lg font-bold">
        Reason for the override (at least {OVERRIDE_REASON_MIN.words} words)
        <textarea
          value={reason}
          onChange={(e) => setReason(e.target.value)}
          rows={3}
          maxLength={2000}
          aria-invalid={Boolean(problem)}
          aria-describedby={problem ? "override-error" : undefined}
          className="rounded-lg border-2 border-steel-700 bg-white p-2 text-lg font-normal aria-[invalid=true]:border-fail"
          data-testid="override-reason"
        />
      </label>
      {problem && (
        <p id="override-error" className="mt-1 text-lg font-bold text-fail" data-testid="error-override">
          ✖ {problem}
        </p>
      )}
      <button
        type="submit"
        className="mt-3 min-h-target rounded-lg bg-fail px-5 text-lg font-bold text-white disabled:opacity-60"
        disabled={send.isPending}
      >
        Move to “{STATUS_LABELS[to]}” with {items.length} item{items.length === 1 ? "" : "s"} open
      </button>
    </form>
  );
}
