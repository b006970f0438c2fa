"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { api } from "@/app/ui/api-client";
import { buttonClass, inputClass } from "@/app/ui/form-field";

// Books a job on the resource shown, on one of the week's opening days. A clash or a time outside
// opening hours comes back from the server with the reason, shown as it is.
export function BookForm(props: {
  resourceId: string;
  resourceName: string;
  days: { day: string; label: string }[];
  jobs: { id: string; label: string }[];
  opensAt: string;
  closesAt: string;
}) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [ok, setOk] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const label = "flex flex-col gap-1 text-base font-bold";
  return (
    <form
      noValidate
      data-testid="book-form"
      className="mt-3 grid grid-cols-1 gap-4 rounded-xl border-2 border-steel-700 bg-white p-4 md:grid-cols-2"
      onSubmit={async (e) => {
        e.preventDefault();
        const f = new FormData(e.currentTarget);
        const note = String(f.get("note") ?? "").trim();
        setBusy(true);
        setError(null);
        setOk(null);
        try {
          await api("POST", "/api/office/bookings", {
            resourceId: props.resourceId,
            workOrderId: String(f.get("workOrderId") ?? ""),
            day: String(f.get("day") ?? ""),
            from: String(f.get("from") ?? ""),
            to: String(f.get("to") ?? ""),
            ...(note ? { note } : {}),
          });
          setOk(`Booked on ${props.resourceName}.`);
          router.refresh();
        } catch (err) {
          setError((err as Error).message);
        } finally {
          setBusy(false);
        }
      }}
    >
      <label className={`${label} md:col-span-2`}>
        Job
        <select name="workOrderId" className={inputClass} required defaultValue="">
          <option value="" disabled>
            Choose a job…
          </option>
          {props.jobs.map((j) => (
            <option key={j.id} value={j.id}>
              {j.label}
            </option>
          ))}
        </select>
      </label>
      <label className={label}>
        Day
        <select name="day" className={inputClass} defaultValue={props.days[0]?.day}>
          {props.days.map((d) => (
            <option key={d.day} value={d.day}>
              {d.label}
            </option>
          ))}
        </select>
      </label>
      <div className="grid grid-cols-2 gap-4">
        <label className={label}>
          From
          <input name="from" type="time" step={900} min={props.opensAt} max={props.closesAt} defaultValue="09:00" className={inputClass} />
        </label>
        <label className={label}>
          Until
          <input name="to" type="time" step={900} min={props.opensAt} max={props.closesAt} defaultValue="11:00" className={inputClass} />
        </label>
      </div>
      <label className={`${label} md:col-span-2`}>
        Note (optional)
        <input name="note" maxLength={500} className={inputClass} />
      </label>
      <div className="md:col-span-2">
        {error && (
          <p role="alert" data-testid="book-error" className="mb-2 text-lg font-bold text-fail">
            ✖ {error}
          </p>
        )}
        {ok && (
          <p role="status" className="mb-2 text-lg font-bold text-pass">
            ✔ {ok}
          </p>
        )}
        <button type="submit" disabled={busy} className={`${buttonClass} min-h-16`}>
          {busy ? "Booking…" : "Book this slot"}
        </button>
      </div>
    </form>
  );
}
