import type { Metadata } from "next";
import Link from "next/link";
import { requirePageArea } from "@/app/_server/session";
import { AppFrame } from "@/app/ui/app-frame";
import { formatDayTime } from "@/lib/format/dates";
import { listReminders, type ReminderRow } from "@/db/aftercare/reminders";
import { db } from "@/db/setup/client";
import { dayLabel, REMINDER_STATE_LABELS, type ReminderState } from "@/lib/aftercare/reminders";
import { ReminderDoneForm } from "./_components/done-form";

export const metadata: Metadata = { title: "Reminders" };

// State in colour, words and shape.
const MARK: Record<ReminderState, { mark: string; className: string }> = {
  overdue: { mark: "✖", className: "text-fail" },
  due: { mark: "◷", className: "text-warn" },
  coming: { mark: "○", className: "" },
  done: { mark: "✔", className: "text-pass" },
};

const MAIL: Record<string, string> = { queued: "e-mail waiting", sending: "e-mail being sent", sent: "e-mailed", failed: "e-mail failed" };

function Rows({ rows, testId, today }: { rows: ReminderRow[]; testId: string; today: string }) {
  if (!rows.length) return <p className="mt-2 text-lg">None.</p>;
  const td = "py-2 pr-4 align-top";
  return (
    <table className="mt-2 w-full border-collapse text-left text-lg" data-testid={testId}>
      <thead>
        <tr className="border-b-2 border-steel-700">
          <th className={td}>State</th>
          <th className={td}>Reminder</th>
          <th className={td}>Due</th>
          <th className={td}>Bike and owner</th>
          <th className={td}>E-mail</th>
          <th className={td}>
            <span className="sr-only">Done</span>
          </th>
        </tr>
      </thead>
      <tbody>
        {rows.map((r) => (
          <tr key={r.id} className="border-b border-steel-300" data-testid="reminder-row">
            <td className={`${td} font-bold ${MARK[r.state].className}`}>
              <span aria-hidden="true">{MARK[r.state].mark}</span> {REMINDER_STATE_LABELS[r.state]}
            </td>
            <td className={td}>
              {r.label} ·{" "}
              <Link className="font-mono underline" href={`/office/work-orders/${r.workOrderId}`}>
                #{r.number}
              </Link>
            </td>
            <td className={td}>
              {dayLabel(r.dueOn)}
              {r.dueOdometerKm !== null && <span className="block text-base">or at {r.dueOdometerKm.toLocaleString("en-GB")} km</span>}
            </td>
            <td className={td}>
              {r.make} {r.model} · <span className="font-mono">{r.tagCode}</span>
              <span className="block text-base">{r.customerName}</span>
            </td>
            <td className={td}>
              {r.mailState
                ? MAIL[r.mailState]
                : !r.customerEmail
                  ? "no e-mail address"
                  : r.dueOn <= today
                    ? "to be sent shortly"
                    : "on its day"}
            </td>
            <td className={td}>
              {r.doneAt ? (
                <span className="text-base">
                  Done {formatDayTime(r.doneAt)} by {r.doneBy}
                  {r.doneNote ? ` — ${r.doneNote}` : ""}
                </span>
              ) : (
                <ReminderDoneForm reminderId={r.id} label={`${r.label}, job #${r.number}`} />
              )}
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

export default async function RemindersPage() {
  const user = await requirePageArea("office");
  const { today, rows } = await listReminders(db(), user.shopId);
  const pick = (...s: ReminderState[]) => rows.filter((r) => s.includes(r.state));
  return (
    <AppFrame user={user} current="/office/reminders">
      <h1 className="text-3xl font-bold">Reminders</h1>
      <p className="mt-2 max-w-3xl text-lg">
        Run-in checks and first services set at handover from the procedure templates&apos; run-in lines, or added on a handed-over work
        order. The customer is e-mailed on the due day. Today is {dayLabel(today)}.
      </p>
      <section className="mt-6">
        <h2 className="text-2xl font-bold">Overdue and due this week</h2>
        <Rows rows={pick("overdue", "due")} testId="reminders-due" today={today} />
      </section>
      <section className="mt-8">
        <h2 className="text-2xl font-bold">Coming up</h2>
        <Rows rows={pick("coming")} testId="reminders-coming" today={today} />
      </section>
      <section className="mt-8">
        <h2 className="text-2xl font-bold">Done in the last 30 days</h2>
        <Rows rows={pick("done")} testId="reminders-done" today={today} />
      </section>
    </AppFrame>
  );
}
