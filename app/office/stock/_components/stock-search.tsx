"use client";

import Link from "next/link";
import { useState, type FormEvent } from "react";
import type { GET } from "@/app/api/office/stock/search/route";
import type { ReplyOf } from "@/app/_server/route";
import { api, type Wire } from "@/app/ui/api-client";
import { buttonClass, inputClass } from "@/app/ui/form-field";
import { formatDay } from "@/lib/format/dates";

type Events = Wire<ReplyOf<typeof GET>>["events"];

const EVENT_WORDS: Record<Events[number]["event"], { word: string; mark: string }> = {
  received: { word: "Received", mark: "⬇" },
  reserved: { word: "Put aside", mark: "⏸" },
  released: { word: "Let go", mark: "↩" },
  returned: { word: "Put back (fit withdrawn)", mark: "⤴" },
  fitted: { word: "Fitted", mark: "⚙" },
};

// "Which bikes got batch X?" across the stock's life: received, put aside, let go, fitted, put back.
export function StockSearch() {
  const [code, setCode] = useState("");
  const [asked, setAsked] = useState<string | null>(null);
  const [events, setEvents] = useState<Events | null>(null);
  const [error, setError] = useState<string | null>(null);
  async function onSubmit(e: FormEvent) {
    e.preventDefault();
    setError(null);
    try {
      const r = await api<{ events: Events }>("GET", `/api/office/stock/search?${new URLSearchParams({ code })}`);
      setEvents(r.events);
      setAsked(code.trim());
    } catch (err) {
      setError((err as Error).message);
    }
  }
  const bikes = new Set(events?.filter((e) => e.event === "fitted" && e.bikeId).map((e) => e.bikeId));
  return (
    <div>
      <form noValidate onSubmit={onSubmit} className="mt-3 flex flex-wrap items-end gap-3">
        <label className="flex flex-col gap-1 font-bold">
          Batch or serial number
          <input
            name="code"
            value={code}
            onChange={(e) => setCode(e.target.value)}
            className={`${inputClass} w-64 font-mono font-normal`}
          />
        </label>
        <button type="submit" className={buttonClass}>
          Search stock
        </button>
      </form>
      {error && (
        <p role="alert" className="mt-2 font-bold text-fail">
          ✖ {error}
        </p>
      )}
      {events && (
        <div className="mt-4" data-testid="stock-search-results">
          <p className="text-lg font-bold">
            “{asked}”: {events.length} event{events.length === 1 ? "" : "s"}, fitted to {bikes.size} bike{bikes.size === 1 ? "" : "s"}
          </p>
          <table className="mt-2 w-full border-collapse text-left">
            <thead>
              <tr className="border-b-2 border-steel-700">
                <th className="pr-3">What</th>
                <th className="pr-3">When</th>
                <th className="pr-3">Part</th>
                <th className="pr-3">Batch / serial</th>
                <th className="pr-3">Qty</th>
                <th className="pr-3">Job</th>
                <th className="pr-3">Bike</th>
                <th className="pr-3">From / shelf</th>
              </tr>
            </thead>
            <tbody>
              {events.map((e, i) => (
                <tr key={i} className="border-b border-steel-300" data-testid={`stock-event-${e.event}`}>
                  <td className="py-1 pr-3 font-bold">
                    <span aria-hidden="true">{EVENT_WORDS[e.event].mark} </span>
                    {EVENT_WORDS[e.event].word}
                  </td>
                  <td className="py-1 pr-3">{formatDay(e.at)}</td>
                  <td className="py-1 pr-3">
                    <span className="font-mono">{e.partNumber}</span> {e.description}
                  </td>
                  <td className="py-1 pr-3 font-mono">{[e.serial, e.batch].filter(Boolean).join(" · ")}</td>
                  <td className="py-1 pr-3">{e.quantity}</td>
                  <td className="py-1 pr-3 font-mono">
                    {e.workOrderId ? (
                      <Link className="underline" href={`/office/work-orders/${e.workOrderId}`}>
                        #{e.workOrderNumber}
                      </Link>
                    ) : (
                      "—"
                    )}
                  </td>
                  <td className="py-1 pr-3">
                    {e.bikeId ? (
                      <Link className="underline" href={`/office/bikes/${e.bikeId}`}>
                        {e.tagCode} {e.make} {e.model} ({e.customerName})
                      </Link>
                    ) : (
                      "—"
                    )}
                  </td>
                  <td className="py-1 pr-3">{[e.supplier, e.location].filter(Boolean).join(" · ")}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </div>
  );
}
