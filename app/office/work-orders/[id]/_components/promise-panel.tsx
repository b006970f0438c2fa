"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { api } from "@/app/ui/api-client";
import { buttonClass, inputClass } from "@/app/ui/form-field";

// The day promised to the customer (who set it and when), a form to set a new one, and the job's
// bookings on the shop's resources.
export function PromisePanel(props: {
  workOrderId: string;
  promised: { label: string; setBy: string; setAt: string } | null;
  bookings: { id: string; text: string; href: string }[];
  closed: boolean;
}) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  return (
    <section className="mb-6 rounded-xl border-2 border-steel-700 bg-white p-4" data-testid="promise-panel">
      <h2 className="text-2xl font-bold">Promised date and bookings</h2>
      <p className="mt-1 text-lg" data-testid="promised-date">
        {props.promised ? (
          <>
            Promised for <strong>{props.promised.label}</strong> (set by {props.promised.setBy}, {props.promised.setAt}).
          </>
        ) : (
          "No date promised yet."
        )}
      </p>
      {!props.closed && (
        <form
          noValidate
          className="mt-2 flex flex-wrap items-end gap-4"
          onSubmit={async (e) => {
            e.preventDefault();
            setError(null);
            try {
              await api("POST", `/api/office/work-orders/${props.workOrderId}/promise`, {
                promisedOn: String(new FormData(e.currentTarget).get("promisedOn") ?? ""),
              });
              router.refresh();
            } catch (err) {
              setError((err as Error).message);
            }
          }}
        >
          <label className="flex flex-col gap-1 text-base font-bold">
            Promise for
            <input type="date" name="promisedOn" className={inputClass} />
          </label>
          <button type="submit" className={buttonClass}>
            Set promised date
          </button>
          {error && <p className="w-full text-lg font-bold text-fail">✖ {error}</p>}
        </form>
      )}
      {props.bookings.length > 0 && (
        <ul className="mt-3 grid gap-1 text-lg">
          {props.bookings.map((b) => (
            <li key={b.id}>
              <a className="underline" href={b.href}>
                ■ {b.text}
              </a>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
