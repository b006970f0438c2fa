"use client";

import { useMutation, useQueryClient } from "@tanstack/react-query";
import { useState } from "react";
import { STATUS_LABELS, type WorkOrderStatus } from "@/lib/work-orders/status";
import { isGatedMove } from "@/lib/work-orders/transition-rules";
import type { ReplyOf } from "@/app/_server/route";
import type { POST } from "@/app/api/office/work-orders/[id]/status/route";
import { api, ApiError, type Wire } from "@/app/ui/api-client";
import { FormMessage, inputClass, quietButtonClass } from "@/app/ui/form-field";
import { OverrideForm } from "./override-form";
import type { WorkOrderData } from "./types";

type Moved = Wire<ReplyOf<typeof POST>>;

/** What the office is told after a move. */
export function movedMessage(r: Moved, to: WorkOrderStatus): string {
  const mail = r.mail ? (r.mail.ok ? " The e-mail to the customer is on its way." : ` E-mail not sent: ${r.mail.error}.`) : "";
  const override = r.overrideId ? " Your override and its reason are on record." : "";
  const report = r.report ? ` The build report is stored (revision ${r.report.revision}).` : "";
  return `Moved to ${STATUS_LABELS[to]}.${override}${report}${mail}`;
}

// Move the job on: one button per move the flow allows; the server gives the reason when a move
// is refused. Going in build pins the chosen procedure templates (their current versions). A move
// to "ready" or "handed over" refused for open items offers the override: a written reason.
export function StatusPanel({ data, onGateRefused }: { data: WorkOrderData; onGateRefused: () => void }) {
  const qc = useQueryClient();
  const wo = data.workOrder;
  const [note, setNote] = useState("");
  const [pins, setPins] = useState<string[]>([]);
  const [message, setMessage] = useState<{ error?: string; ok?: string }>({});
  const [gated, setGated] = useState<WorkOrderStatus | null>(null);
  const refresh = () => qc.invalidateQueries({ queryKey: ["work-order", wo.id] });
  const move = useMutation({
    mutationFn: (to: WorkOrderStatus) =>
      api<Moved>("POST", `/api/office/work-orders/${wo.id}/status`, {
        to,
        note,
        templateVersionIds: to === "in_build" ? pins : [],
      }),
    onSuccess: (r, to) => {
      setMessage({ ok: movedMessage(r, to) });
      setNote("");
      setPins([]);
      setGated(null);
      void refresh();
    },
    onError: (e, to) => {
      setMessage({ error: (e as Error).message });
      if (e instanceof ApiError && e.status === 409 && isGatedMove(to) && e.issues.some((i) => i.path === "openItems")) {
        setGated(to);
        onGateRefused();
        void refresh();
      }
    },
  });
  const moves = data.next.filter((s) => s !== "approved");
  const goesInBuild = data.next.includes("in_build");
  return (
    <section className="rounded-xl border-2 border-steel-700 bg-white p-4" aria-labelledby="status-heading">
      <h2 id="status-heading" className="text-2xl font-bold">
        Move the job on
      </h2>
      {data.next.includes("approved") && (
        <p className="mt-2 text-lg">Waiting for the customer to approve the quote from their own sign-in.</p>
      )}
      {goesInBuild && (
        <fieldset className="mt-3">
          <legend className="text-base font-bold">Procedures to pin when it goes in build</legend>
          {wo.procedures.length > 0 && (
            <p className="text-sm">Already pinned: {wo.procedures.map((p) => `${p.name} v${p.version}`).join(", ")}</p>
          )}
          <div className="mt-2 grid gap-2 md:grid-cols-2">
            {data.templates
              .filter((t) => !wo.procedures.some((p) => p.versionId === t.versionId))
              .map((t) => (
                <label key={t.versionId} className="flex min-h-12 items-center gap-3 rounded-lg border-2 border-steel-300 px-3">
                  <input
                    type="checkbox"
                    className="h-6 w-6"
                    checked={pins.includes(t.versionId)}
                    onChange={(e) => setPins((p) => (e.target.checked ? [...p, t.versionId] : p.filter((x) => x !== t.versionId)))}
                  />
                  <span>
                    {t.name} <span className="text-steel-700">v{t.version}</span>
                  </span>
                </label>
              ))}
          </div>
        </fieldset>
      )}
      {moves.length > 0 && (
        <>
          <label className="mt-3 flex flex-col gap-1 font-bold">
            Note for the record (optional)
            <input value={note} onChange={(e) => setNote(e.target.value)} className={`${inputClass} font-normal`} maxLength={1000} />
          </label>
          <div className="mt-3 flex flex-wrap gap-3">
            {moves.map((s) => (
              <button key={s} type="button" className={quietButtonClass} disabled={move.isPending} onClick={() => move.mutate(s)}>
                → {STATUS_LABELS[s]}
              </button>
            ))}
          </div>
        </>
      )}
      {data.next.length === 0 && <p className="mt-2 text-lg">This work order is closed.</p>}
      <div className="mt-3">
        <FormMessage error={message.error} ok={message.ok} />
      </div>
      {gated && data.next.includes(gated) && data.openItems.length > 0 && (
        <OverrideForm
          workOrderId={wo.id}
          to={gated}
          items={data.openItems}
          note={note}
          onDone={(r) => {
            setMessage({ ok: movedMessage(r, gated) });
            setGated(null);
            setNote("");
            void refresh();
          }}
        />
      )}
    </section>
  );
}

export function AssignPanel({ data }: { data: WorkOrderData }) {
  const qc = useQueryClient();
  const [mechanicId, setMechanicId] = useState(data.workOrder.mechanicId ?? "");
  const [message, setMessage] = useState<{ error?: string; ok?: string }>({});
  const save = useMutation({
    mutationFn: () => api("POST", `/api/office/work-orders/${data.workOrder.id}/assign`, { mechanicId: mechanicId || null }),
    onSuccess: () => {
      setMessage({ ok: "Mechanic saved." });
      void qc.invalidateQueries({ queryKey: ["work-order", data.workOrder.id] });
    },
    onError: (e) => setMessage({ error: (e as Error).message }),
  });
  return (
    <section className="rounded-xl border-2 border-steel-300 bg-white p-4">
      <h2 className="text-xl font-bold">Mechanic</h2>
      <div className="mt-2 flex flex-wrap items-center gap-3">
        <label htmlFor="mechanic" className="sr-only">
          Mechanic
        </label>
        <select id="mechanic" value={mechanicId} onChange={(e) => setMechanicId(e.target.value)} className={inputClass}>
          <option value="">Nobody yet</option>
          {data.mechanics.map((m) => (
            <option key={m.id} value={m.id}>
              {m.name}
            </option>
          ))}
        </select>
        <button type="button" className={quietButtonClass} onClick={() => save.mutate()} disabled={save.isPending}>
          Assign
        </button>
      </div>
      <div className="mt-2">
        <FormMessage error={message.error} ok={message.ok} />
      </div>
    </section>
  );
}
