"use client";

import { useMutation } from "@tanstack/react-query";
import { useState } from "react";
import { api, ApiError, type FieldIssue } from "@/app/ui/api-client";
import { buttonClass, FormMessage } from "@/app/ui/form-field";
import { REVIEW_COUNT_EVENT } from "@/app/ui/review-count";
import { decisionInputSchema } from "@/lib/review/decision-input";
import type { SignOffReview } from "./review-types";
import { LetStandItem } from "./let-stand";
import { VerdictTag, When } from "./when";

type Choice = "approved" | "sent_back";

// Approve (every reading out of tolerance and every flagged entry let stand with a written reason)
// or send back (a reason and the steps to reopen). Checked here with the server's own schema; the server's refusals are
// shown beside the field they name.
export function DecisionPanel({
  review,
  onDecided,
  onReload,
}: {
  review: SignOffReview;
  onDecided: (message: string) => void;
  /** Fetches the record again (after a refusal because it changed), keeping what was typed here. */
  onReload: () => void;
}) {
  const open = review.outOfTolerance.filter((o) => !o.acceptance);
  const openFlags = review.flagged.filter((f) => !f.acceptance);
  const [choice, setChoice] = useState<Choice | null>(null);
  const [reason, setReason] = useState("");
  const [steps, setSteps] = useState<string[]>(review.defaultReopenStepIds);
  const [why, setWhy] = useState<Record<string, string>>({});
  const [letStand, setLetStand] = useState<Record<string, boolean>>({});
  const [issues, setIssues] = useState<Record<string, string>>({});

  const mutation = useMutation({
    mutationFn: (body: unknown) =>
      api<{ decision: Choice; reopenedStepIds: string[] }>("POST", `/api/review/sign-offs/${review.signOff.id}/decisions`, body),
    onSuccess: (r) => {
      onDecided(
        r.decision === "approved"
          ? "Approved. The decision is on record."
          : `Sent back. ${r.reopenedStepIds.length === 1 ? "1 step reopens" : `${r.reopenedStepIds.length} steps reopen`} on the mechanic's tablet at its next sync.`,
      );
      window.dispatchEvent(new Event(REVIEW_COUNT_EVENT));
    },
    onError: (e) => {
      if (e instanceof ApiError) setIssues(mapIssues(e.issues, body()));
    },
  });

  function body() {
    const acceptances = open
      .filter((o) => letStand[o.readingId])
      .map((o) => ({ readingId: o.readingId, justification: why[o.readingId] ?? "" }));
    const flagAcceptances = openFlags
      .filter((f) => letStand[f.operationId])
      .map((f) => ({ operationId: f.operationId, justification: why[f.operationId] ?? "" }));
    const seen = { expectedDecisionId: review.standingDecisionId, seenUpTo: review.seenUpTo };
    return choice === "sent_back"
      ? { decision: choice, ...seen, reason, reopenStepIds: steps, acceptances, flagAcceptances }
      : { decision: "approved" as const, ...seen, acceptances, flagAcceptances };
  }

  function submit() {
    setIssues({});
    const b = body();
    const found: Record<string, string> = {};
    if (b.decision === "approved") {
      for (const o of open)
        if (!letStand[o.readingId])
          found[`reading.${o.readingId}`] = "Out of tolerance: let it stand with a written reason, or send the step back.";
      for (const f of openFlags)
        if (!letStand[f.operationId])
          found[`flagged.${f.operationId}`] = "Flagged: accept it with a written reason, or send the step back.";
    }
    const parsed = decisionInputSchema.safeParse(b);
    if (!parsed.success)
      Object.assign(
        found,
        mapIssues(
          parsed.error.issues.map((i) => ({ path: i.path.map(String).join("."), message: i.message })),
          b,
        ),
      );
    if (Object.keys(found).length) {
      setIssues(found);
      return;
    }
    mutation.mutate(parsed.data);
  }

  if (!review.mayDecide) {
    return (
      <p className="rounded-lg border-2 border-steel-700 bg-steel-50 p-3 text-lg font-bold" data-testid="may-not-decide">
        {review.whyNot}
      </p>
    );
  }

  const serverError = mutation.error instanceof Error ? mutation.error.message : null;
  return (
    <section aria-label="Decision" className="rounded-xl border-4 border-steel-900 bg-white p-4" id="decide">
      <h2 className="text-2xl font-bold">Your decision</h2>
      {open.length > 0 && (
        <div className="mt-3">
          <h3 className="text-lg font-bold">Readings out of tolerance</h3>
          <p className="text-base">
            To approve, let each one stand with a written reason (kept with the reading for good); or send its step back.
          </p>
          <ul className="mt-2 space-y-3">
            {open.map((o) => (
              <LetStandItem
                key={o.readingId}
                testId="oot-reading"
                errorTestId="error-reading"
                checked={Boolean(letStand[o.readingId])}
                onCheck={(v) => setLetStand({ ...letStand, [o.readingId]: v })}
                checkLabel="Let this reading stand"
                whyLabel="Why may it stand?"
                why={why[o.readingId] ?? ""}
                onWhy={(v) => setWhy({ ...why, [o.readingId]: v })}
                error={issues[`reading.${o.readingId}`] ?? issues[`why.${o.readingId}`]}
              >
                <p className="flex flex-wrap items-center gap-2 text-lg">
                  <VerdictTag verdict={o.verdict} />
                  <span className="font-bold">
                    {o.specLabel}, {o.readingLabel}:{" "}
                    <span className="font-mono">
                      {o.value} {o.unit}
                    </span>
                  </span>
                  <span className="text-base">
                    (limits {o.min} to {o.max} {o.unit}; step “{o.stepTitle}”)
                  </span>
                </p>
                {o.note && <p className="text-base">Mechanic’s note: “{o.note}”</p>}
              </LetStandItem>
            ))}
          </ul>
        </div>
      )}

      {openFlags.length > 0 && (
        <div className="mt-3">
          <h3 className="text-lg font-bold">Flagged entries</h3>
          <p className="text-base">
            The sync kept these and flagged them for you. To approve, accept each with a written reason (kept with the entry for good); or
            send its step back.
          </p>
          <ul className="mt-2 space-y-3">
            {openFlags.map((f) => (
              <LetStandItem
                key={f.operationId}
                testId="flagged-entry"
                errorTestId="error-flagged"
                checked={Boolean(letStand[f.operationId])}
                onCheck={(v) => setLetStand({ ...letStand, [f.operationId]: v })}
                checkLabel="Accept this entry"
                whyLabel="Why may it stand?"
                why={why[f.operationId] ?? ""}
                onWhy={(v) => setWhy({ ...why, [f.operationId]: v })}
                error={issues[`flagged.${f.operationId}`] ?? issues[`why.${f.operationId}`]}
              >
                <p className="text-lg">
                  <span className="font-bold text-warn">⚑ {f.description}</span> by {f.by.name}{" "}
                  <When device={f.deviceTime} received={f.receivedAt} />
                </p>
                <p className="text-base">Why it was flagged: {f.flagReason}</p>
                {f.afterApproval && <p className="text-base font-bold">Came in after this stage was approved.</p>}
                {f.onNoStage && <p className="text-base">Not tied to any stage of the job: it is shown on every stage’s review.</p>}
              </LetStandItem>
            ))}
          </ul>
        </div>
      )}

      <fieldset className="mt-4">
        <legend className="text-lg font-bold">Decide</legend>
        <div className="mt-2 flex flex-wrap gap-3">
          {(["approved", "sent_back"] as const).map((c) => (
            <label
              key={c}
              className={`flex min-h-target cursor-pointer items-center gap-3 rounded-xl border-4 px-5 text-xl font-bold ${choice === c ? "border-ink bg-signal" : "border-steel-700 bg-white"}`}
            >
              <input type="radio" name="choice" className="h-6 w-6" checked={choice === c} onChange={() => setChoice(c)} />
              {c === "approved" ? "✔ Approve" : "↺ Send back"}
            </label>
          ))}
        </div>
      </fieldset>

      {choice === "sent_back" && (
        <div className="mt-4 flex flex-col gap-3">
          <label className="flex flex-col gap-1 text-lg font-bold">
            Why it goes back (the mechanic sees this on the step)
            <textarea
              value={reason}
              onChange={(e) => setReason(e.target.value)}
              rows={3}
              aria-invalid={Boolean(issues.reason)}
              aria-describedby={issues.reason ? "reason-error" : undefined}
              className="rounded-lg border-2 border-steel-700 p-2 text-lg font-normal aria-[invalid=true]:border-fail"
            />
          </label>
          {issues.reason && (
            <p id="reason-error" className="font-bold text-fail" data-testid="error-reason">
              ✖ {issues.reason}
            </p>
          )}
          <fieldset>
            <legend className="text-lg font-bold">Steps to reopen</legend>
            <ul className="mt-1 grid gap-2 md:grid-cols-2">
              {review.steps.map((s) => (
                <li key={s.id}>
                  <label className="flex min-h-12 items-center gap-3 rounded-lg border-2 border-steel-300 px-3 text-lg">
                    <input
                      type="checkbox"
                      className="h-7 w-7"
                      checked={steps.includes(s.id)}
                      onChange={(e) => setSteps(e.target.checked ? [...steps, s.id] : steps.filter((x) => x !== s.id))}
                    />
                    {s.number}. {s.title}
                  </label>
                </li>
              ))}
            </ul>
            {issues.reopenStepIds && (
              <p className="mt-1 font-bold text-fail" data-testid="error-steps">
                ✖ {issues.reopenStepIds}
              </p>
            )}
          </fieldset>
        </div>
      )}

      <div className="mt-4 flex flex-col gap-3">
        {serverError && <FormMessage error={serverError} />}
        {mutation.error instanceof ApiError && mutation.error.issues.some((i) => i.path === "seenUpTo") && (
          <button
            type="button"
            className={`${buttonClass} min-h-target text-xl`}
            data-testid="reload-record"
            onClick={() => {
              mutation.reset();
              onReload();
            }}
          >
            Reload the record (what you typed stays)
          </button>
        )}
        <button type="button" className={`${buttonClass} min-h-target text-xl`} disabled={!choice || mutation.isPending} onClick={submit}>
          {choice === "sent_back"
            ? "Send back to the bench"
            : choice === "approved"
              ? `Approve “${review.stage.title}”`
              : "Choose approve or send back"}
        </button>
      </div>
    </section>
  );
}

// Server and schema issue paths → the field keys this form shows them at.
function mapIssues(
  list: FieldIssue[],
  body: { acceptances: Array<{ readingId: string }>; flagAcceptances: Array<{ operationId: string }> },
): Record<string, string> {
  const out: Record<string, string> = {};
  for (const i of list) {
    const m = i.path.match(/^acceptances\.(\d+)\.(justification|readingId)$/);
    const f = i.path.match(/^flagAcceptances\.(\d+)\.(justification|operationId)$/);
    const key = m
      ? `why.${body.acceptances[Number(m[1])]?.readingId}`
      : f
        ? `why.${body.flagAcceptances[Number(f[1])]?.operationId}`
        : i.path.startsWith("reopenStepIds")
          ? "reopenStepIds"
          : i.path;
    out[key] ??= i.message;
  }
  return out;
}
