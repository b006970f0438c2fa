"use client";

import { useQuery, useQueryClient } from "@tanstack/react-query";
import Link from "next/link";
import { useState } from "react";
import { api } from "@/app/ui/api-client";
import { formatDayTime } from "@/lib/format/dates";
import { FormMessage, quietButtonClass } from "@/app/ui/form-field";
import { HoursPanel } from "@/app/ui/hours-panel";
import { DecisionPanel } from "./decision-panel";
import type { SignOffReview } from "./review-types";
import { StepRecord, Withdrawn } from "./step-record";
import { When } from "./when";

/** One sign-off under review: the record of its stage, then the decision. */
export function ReviewScreen({ signOffId, canCloseClocks = false }: { signOffId: string; canCloseClocks?: boolean }) {
  const client = useQueryClient();
  const [message, setMessage] = useState<string | null>(null);
  const [changing, setChanging] = useState(false);
  const key = ["review-sign-off", signOffId];
  const q = useQuery({ queryKey: key, queryFn: () => api<SignOffReview>("GET", `/api/review/sign-offs/${signOffId}`) });
  if (q.isLoading) return <p className="text-lg">Loading the sign-off…</p>;
  if (q.isError || !q.data)
    return (
      <p role="alert" className="text-lg font-bold text-fail">
        {(q.error as Error)?.message ?? "Could not load the sign-off."}
      </p>
    );
  const r = q.data;
  const standing = r.decisions.at(-1);
  return (
    <div className="flex max-w-5xl flex-col gap-4">
      <nav className="flex flex-wrap gap-6 text-lg font-bold">
        <Link href="/review" className="underline">
          ← All sign-offs waiting
        </Link>
        <Link href={`/audit?job=${r.job.number}`} className="underline">
          Audit trail of job #{r.job.number}
        </Link>
      </nav>
      <header>
        <p className="text-lg">
          <span className="font-mono font-bold">#{r.job.number}</span> · {r.job.bike.make} {r.job.bike.model}{" "}
          <span className="font-mono">{r.job.bike.tagCode}</span> · {r.job.title} · {r.job.statusLabel}
        </p>
        <h1 className="text-3xl font-bold">{r.stage.title}</h1>
        <p className="text-base text-steel-700">{r.stage.procedureName}</p>
        <p className="mt-2 flex flex-wrap items-baseline gap-x-3 text-lg">
          <span className="font-bold">Signed off by {r.signOff.by.name}</span>
          <When device={r.signOff.deviceTime} received={r.signOff.receivedAt} />
          <span className="font-mono text-sm">tablet {r.signOff.deviceId}</span>
        </p>
        {r.signOff.flagReason && (
          <p className="mt-2 rounded-lg border-4 border-warn bg-warn-light p-3 font-bold text-warn">
            ⚑ The sync flagged this sign-off: {r.signOff.flagReason}
          </p>
        )}
        {r.signOff.withdrawn && (
          <div className="mt-2" data-testid="sign-off-withdrawn">
            <p className="text-lg font-bold text-fail">This sign-off was withdrawn: the stage waits for a new sign-off.</p>
            <Withdrawn w={r.signOff.withdrawn} />
          </div>
        )}
        {!r.signOff.isLatest && (
          <p className="mt-2 rounded-lg border-4 border-warn bg-warn-light p-3 font-bold text-warn">
            This stage has been signed off again since; this is an older sign-off.
          </p>
        )}
      </header>

      {r.stretchBoltsTwice.length > 0 && (
        <div role="alert" className="rounded-lg border-8 border-fail bg-fail-light p-4 text-fail" data-testid="stretch-bolts-twice">
          <p className="text-2xl font-bold">⚠ Torque-to-yield bolts recorded twice</p>
          <p className="text-lg">
            A stretch bolt tightened again may be past its yield point. Check each one, and have a new bolt fitted if in doubt:
          </p>
          <ul className="mt-1 list-inside list-disc text-lg font-bold">
            {r.stretchBoltsTwice.map((b) => (
              <li key={`${b.specLabel}|${b.passIndex}|${b.bolt}`}>
                {b.stepTitle} — {b.specLabel}: bolt {b.bolt}, pass {b.passIndex} ({b.records.map((x) => x.by.name).join(" and ")})
              </li>
            ))}
          </ul>
        </div>
      )}

      {standing && (
        <p
          className={`rounded-lg border-4 p-3 text-lg font-bold ${standing.decision === "approved" ? "border-pass bg-pass-light text-pass" : "border-fail bg-fail-light text-fail"}`}
          data-testid="standing-decision"
        >
          {standing.decision === "approved" ? "✔ Approved" : `↺ Sent back: “${standing.reason}”`} by {standing.by.name},{" "}
          {formatDayTime(standing.decidedAt)}
          {r.decisions.length > 1 ? ` (replaces ${r.decisions.length - 1} earlier decision${r.decisions.length > 2 ? "s" : ""})` : ""}
        </p>
      )}

      <p className="text-lg" data-testid="review-summary">
        {r.steps.length} steps ·{" "}
        {r.outOfTolerance.length === 0 ? (
          "every reading in tolerance"
        ) : (
          <a href="#decide" className="font-bold text-fail underline">
            ▲ {r.outOfTolerance.length} reading{r.outOfTolerance.length === 1 ? "" : "s"} out of tolerance
          </a>
        )}
        {r.withdrawnCount > 0 && (
          <span className="font-bold text-fail">
            {" "}
            · ⊘ {r.withdrawnCount} entr{r.withdrawnCount === 1 ? "y" : "ies"} withdrawn (marked below)
          </span>
        )}
      </p>

      {r.flagged.length > 0 && (
        <section className="rounded-lg border-4 border-warn bg-white p-3" data-testid="review-flagged">
          <h2 className="text-xl font-bold text-warn">⚑ Flagged entries ({r.flagged.length})</h2>
          <ul className="mt-2 space-y-2">
            {r.flagged.map((f) => (
              <li key={f.operationId} className="text-lg">
                <span className="font-bold">{f.description}</span> by {f.by.name}: {f.flagReason}{" "}
                {f.acceptance ? (
                  <span className="font-bold text-pass">
                    ✔ accepted by {f.acceptance.by.name}, {formatDayTime(f.acceptance.acceptedAt)}: “{f.acceptance.justification}”
                  </span>
                ) : (
                  <span className="font-bold text-fail">✖ not accepted yet{f.afterApproval ? " (came in after the approval)" : ""}</span>
                )}
              </li>
            ))}
          </ul>
        </section>
      )}

      {r.earlier.length > 0 && (
        <details className="rounded-lg border-2 border-steel-300 bg-white p-3">
          <summary className="cursor-pointer text-lg font-bold">Earlier sign-offs of this stage ({r.earlier.length})</summary>
          <ul className="mt-2 space-y-1">
            {r.earlier.map((e) => (
              <li key={e.id}>
                {formatDayTime(e.deviceTime)} by {e.by.name}:{" "}
                {e.decisions.length === 0
                  ? "no decision"
                  : e.decisions
                      .map((d) => `${d.decision === "approved" ? "approved" : `sent back (“${d.reason}”)`} by ${d.by.name}`)
                      .join("; then ")}
              </li>
            ))}
          </ul>
        </details>
      )}

      {r.steps.map((s) => (
        <StepRecord key={s.id} step={s} />
      ))}

      {message && <FormMessage ok={message} />}
      {standing && !changing ? (
        r.mayDecide && (
          <button
            type="button"
            className={`${quietButtonClass} self-start`}
            onClick={() => {
              setMessage(null);
              setChanging(true);
            }}
          >
            Make a new decision (it replaces the standing one)
          </button>
        )
      ) : (
        <DecisionPanel
          key={r.standingDecisionId ?? "none"}
          review={r}
          onDecided={(text) => {
            setMessage(text);
            setChanging(false);
            void client.invalidateQueries({ queryKey: key });
          }}
          onReload={() => void client.invalidateQueries({ queryKey: key })}
        />
      )}
      <HoursPanel jobId={r.job.id} canClose={canCloseClocks} />
    </div>
  );
}
