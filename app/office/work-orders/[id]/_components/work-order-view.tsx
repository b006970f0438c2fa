"use client";

import { useQuery } from "@tanstack/react-query";
import Link from "next/link";
import { useState } from "react";
import { READY_FOR_BUILD_NOTICE } from "@/lib/office/deposit-notice";
import { STATUS_LABELS } from "@/lib/work-orders/status";
import { formatDayTime } from "@/lib/format/dates";
import { StatusBadge } from "@/app/ui/status-badge";
import { HoursPanel } from "@/app/ui/hours-panel";
import { AftercarePanel } from "./aftercare-panel";
import { BuildProgressPanel } from "./build-progress-panel";
import { NotesPanel } from "./notes-panel";
import { OpenItemsPanel } from "./open-items-panel";
import { ReportCopies } from "./report-copies";
import { PartsPanel } from "./parts-panel";
import { QuoteEditor } from "./quote-editor";
import { AssignPanel, StatusPanel } from "./status-panel";
import type { WorkOrderData } from "./types";
import { noReasonGiven } from "@/lib/errors";

const MAIL_KIND = {
  quote_ready: "Quote ready",
  deposit_received: "Deposit received",
  bike_ready: "Bike ready",
  review_needed: "Readings out of tolerance, for the supervisor",
  service_reminder: "Reminder (run-in or service)",
} as const;

export function WorkOrderView({ id, currency, taxRateBp, warning }: { id: string; currency: string; taxRateBp: number; warning?: string }) {
  const [gateRefused, setGateRefused] = useState(false);
  const q = useQuery({
    queryKey: ["work-order", id],
    queryFn: async () => {
      const res = await fetch(`/api/office/work-orders/${id}`);
      const data = await res.json().catch(() => ({}));
      if (!res.ok) throw new Error(data.error ?? noReasonGiven(res.status));
      return data as WorkOrderData;
    },
  });
  if (q.isLoading) return <p className="text-lg">Loading…</p>;
  if (q.isError || !q.data)
    return (
      <p role="alert" className="text-lg font-bold text-fail">
        {(q.error as Error)?.message ?? "Not found"}
      </p>
    );
  const data = q.data;
  const wo = data.workOrder;
  return (
    <div className="grid gap-6">
      <header className="flex flex-wrap items-start gap-4">
        <div className="flex-1">
          <p>
            <Link href="/office" className="underline">
              ◀ Work orders
            </Link>
          </p>
          <h1 className="mt-1 text-3xl font-bold">
            <span className="font-mono">#{wo.number}</span> {wo.title}
          </h1>
          <p className="mt-2 flex flex-wrap items-center gap-3 text-lg">
            <span data-testid="work-order-status">
              <StatusBadge status={wo.status} />
            </span>
            <Link href={`/office/bikes/${wo.bikeId}`} className="underline">
              {wo.make} {wo.model} {wo.year ? `(${wo.year})` : ""} · <span className="font-mono">{wo.tagCode}</span>
            </Link>
            <span>
              Owner{" "}
              <Link href={`/office/customers/${wo.customerId}`} className="underline">
                {wo.customerName}
              </Link>
              {wo.customerEmail ? ` · ${wo.customerEmail}` : ""} {wo.customerPhone ? ` · ${wo.customerPhone}` : ""}
            </span>
          </p>
          <p className="mt-2 text-lg">
            <span className="font-bold">Complaint or goal:</span> {wo.complaint}{" "}
            {wo.odometerKm !== null && <span className="font-mono">· {wo.odometerKm.toLocaleString("en-GB")} km at intake</span>}
          </p>
        </div>
      </header>
      {warning && (
        <p role="alert" className="rounded-lg border-2 border-warn bg-warn-light p-3 font-bold text-warn">
          {warning}
        </p>
      )}
      {wo.readyForBuild && (
        <p
          role="status"
          className="rounded-lg border-4 border-pass bg-pass-light p-3 text-lg font-bold text-pass"
          data-testid="ready-for-build"
        >
          <span aria-hidden="true">✔</span> {READY_FOR_BUILD_NOTICE}
          {wo.depositPaidAt ? ` (paid ${formatDayTime(wo.depositPaidAt)})` : ""}
        </p>
      )}
      <div className="grid gap-6 lg:grid-cols-[2fr_1fr]">
        <StatusPanel data={data} onGateRefused={() => setGateRefused(true)} />
        <AssignPanel data={data} />
      </div>
      <AftercarePanel data={data} />
      <OpenItemsPanel data={data} highlight={gateRefused} />
      <ReportCopies data={data} />
      <BuildProgressPanel workOrderId={wo.id} number={wo.number} />
      <HoursPanel jobId={wo.id} />
      <QuoteEditor key={data.quotes.map((x) => `${x.id}${x.status}`).join()} data={data} currency={currency} taxRateBp={taxRateBp} />
      <NotesPanel data={data} />
      <PartsPanel data={data} />
      {wo.withdrawn.length > 0 && (
        <section className="rounded-xl border-2 border-fail bg-white p-4" aria-labelledby="withdrawn-heading">
          <h2 id="withdrawn-heading" className="text-2xl font-bold">
            Withdrawn at the bench
          </h2>
          <p className="text-base">Taken back with a reason: each stays on the record, marked, and no longer counts.</p>
          <ul className="mt-2 space-y-1" data-testid="withdrawn-entries">
            {wo.withdrawn.map((w) => (
              <li key={w.id} className="text-lg">
                <span className="line-through">{w.what}</span> · recorded by {w.recordedBy}, {formatDayTime(w.recordedAt)} ·{" "}
                <span className="font-bold text-fail">
                  ⊘ withdrawn by {w.withdrawnBy}, {formatDayTime(w.withdrawnAt)}: “{w.reason}”
                </span>
              </li>
            ))}
          </ul>
        </section>
      )}
      <section className="rounded-xl border-2 border-steel-300 bg-white p-4">
        <h2 className="text-2xl font-bold">History</h2>
        <ol className="mt-2 space-y-1" data-testid="transitions">
          {wo.transitions.map((t) => (
            <li key={t.id} className="text-lg">
              {formatDayTime(t.at)} · {t.from ? `${STATUS_LABELS[t.from]} → ` : ""}
              <span className="font-bold">{STATUS_LABELS[t.to]}</span> · {t.byName ?? "—"}
              {t.note ? ` · “${t.note}”` : ""}
            </li>
          ))}
        </ol>
        <h3 className="mt-4 text-xl font-bold">E-mails about this job</h3>
        {wo.emails.length === 0 ? (
          <p>None sent yet.</p>
        ) : (
          <ul className="mt-1 space-y-1" data-testid="emails">
            {wo.emails.map((m) => (
              <li key={m.id}>
                {formatDayTime(m.at)} · {MAIL_KIND[m.kind as keyof typeof MAIL_KIND] ?? m.kind} to {m.recipient}{" "}
                {m.error ? <span className="font-bold text-fail">✖ not sent: {m.error}</span> : <span className="text-pass">✔ sent</span>}
              </li>
            ))}
          </ul>
        )}
        {wo.procedures.length > 0 && (
          <>
            <h3 className="mt-4 text-xl font-bold">Procedures pinned</h3>
            <ul data-testid="pinned-procedures">
              {wo.procedures.map((p) => (
                <li key={p.id}>
                  {p.name} — version {p.version}
                </li>
              ))}
            </ul>
          </>
        )}
      </section>
    </div>
  );
}
