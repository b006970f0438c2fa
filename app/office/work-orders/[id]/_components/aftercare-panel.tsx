"use client";

import { useQueryClient } from "@tanstack/react-query";
import Link from "next/link";
import { api } from "@/app/ui/api-client";
import { buttonClass, Field, FormMessage, inputClass } from "@/app/ui/form-field";
import { useCheckedForm } from "@/app/ui/use-checked-form";
import { dayLabel, newReminderSchema, REMINDER_STATE_LABELS } from "@/lib/aftercare/reminders";
import type { WorkOrderData } from "./types";

// After handover: the come-backs of this job (or the job this one is a come-back of), opening a
// come-back, and the job's reminders with a form to add one.
export function AftercarePanel({ data }: { data: WorkOrderData }) {
  const wo = data.workOrder;
  const { isComeBack, comeBacks } = data.comeBacks;
  const handedOver = wo.status === "handed_over";
  if (!isComeBack && !comeBacks.length && !handedOver && !data.reminders.length) return null;
  return (
    <section className="rounded-xl border-2 border-steel-300 bg-white p-4" aria-labelledby="aftercare-heading" data-testid="aftercare">
      <h2 id="aftercare-heading" className="text-2xl font-bold">
        After handover
      </h2>
      {isComeBack && (
        <p className="mt-2 text-lg font-bold">
          ↩ This job is a come-back of job #{isComeBack.originalNumber}:{" "}
          <Link className="underline" href={`/come-backs/${isComeBack.id}`}>
            see it beside the original build
          </Link>
        </p>
      )}
      {comeBacks.length > 0 && (
        <ul className="mt-2 text-lg" data-testid="come-back-links">
          {comeBacks.map((c) => (
            <li key={c.id}>
              ↩ Came back as{" "}
              <Link className="font-mono underline" href={`/come-backs/${c.id}`}>
                #{c.comeBackNumber}
              </Link>
            </li>
          ))}
        </ul>
      )}
      {handedOver && (
        <p className="mt-3">
          <Link
            href={`/come-backs/new?original=${wo.id}`}
            className={`${buttonClass} inline-flex min-h-16 items-center`}
            data-testid="open-come-back-link"
          >
            Bike back with a fault? Open a come-back
          </Link>
        </p>
      )}
      <h3 className="mt-4 text-xl font-bold">Reminders</h3>
      {data.reminders.length ? (
        <ul className="mt-1 text-lg" data-testid="work-order-reminders">
          {data.reminders.map((r) => (
            <li key={r.id}>
              {r.label}: {dayLabel(r.dueOn)}
              {r.dueOdometerKm !== null ? ` or at ${r.dueOdometerKm.toLocaleString("en-GB")} km` : ""} ·{" "}
              <span className="font-bold">{REMINDER_STATE_LABELS[r.state]}</span>
            </li>
          ))}
        </ul>
      ) : (
        <p className="text-lg">None.</p>
      )}
      {handedOver && <AddReminder workOrderId={wo.id} />}
    </section>
  );
}

function AddReminder({ workOrderId }: { workOrderId: string }) {
  const qc = useQueryClient();
  const { errors: fields, message, submit } = useCheckedForm();
  return (
    <form
      noValidate
      className="mt-3 grid gap-3 md:grid-cols-[2fr_1fr_1fr_auto] md:items-end"
      data-testid="add-reminder"
      onSubmit={async (e) => {
        e.preventDefault();
        const form = e.currentTarget;
        const f = new FormData(form);
        const km = String(f.get("dueOdometerKm") ?? "").trim();
        const values = {
          label: String(f.get("label") ?? ""),
          dueOn: String(f.get("dueOn") ?? ""),
          dueOdometerKm: km === "" ? null : Number(km),
        };
        const sent = await submit(newReminderSchema, values, async (data) => {
          await api("POST", `/api/office/work-orders/${workOrderId}/reminders`, data);
          return "Reminder added.";
        });
        if (sent) {
          form.reset();
          await qc.invalidateQueries({ queryKey: ["work-order", workOrderId] });
        }
      }}
    >
      <Field label="Reminder" name="label" error={fields.label}>
        <input id="label" name="label" maxLength={120} className={inputClass} placeholder="e.g. Run-in check" />
      </Field>
      <Field label="Due date" name="dueOn" error={fields.dueOn}>
        <input id="dueOn" name="dueOn" type="date" className={inputClass} />
      </Field>
      <Field label="Or at (km)" name="dueOdometerKm" error={fields.dueOdometerKm}>
        <input id="dueOdometerKm" name="dueOdometerKm" inputMode="numeric" className={inputClass} />
      </Field>
      <button type="submit" className={`${buttonClass} min-h-16`}>
        Add reminder
      </button>
      <div className="md:col-span-4">
        <FormMessage error={message.error} ok={message.ok} />
      </div>
    </form>
  );
}
