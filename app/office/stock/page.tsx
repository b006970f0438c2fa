import type { Metadata } from "next";
import Link from "next/link";
import { requirePageArea } from "@/app/_server/session";
import { AppFrame } from "@/app/ui/app-frame";
import { db } from "@/db/setup/client";
import { lotsOnHand, lowStock, openReservations, stockShortfalls } from "@/db/stock/on-hand";
import { lotName } from "@/lib/stock/draw";
import { formatDay, formatDayTime } from "@/lib/format/dates";
import { ReceiveForm } from "./_components/receive-form";
import { ReleaseForm, ReserveForm } from "./_components/reserve-form";
import { StockSearch } from "./_components/stock-search";

export const metadata: Metadata = { title: "Stock" };

const section = "mt-10";
const th = "pb-1 pr-3";
const td = "py-2 pr-3 align-top";

// The shop's stock: receive a delivery, what is on the shelf (put some aside for a job), what is put
// aside, the low-stock list, fits the shelf could not cover, and the batch search.
export default async function StockPage() {
  const user = await requirePageArea("office");
  const [lots, reservations, low, shortfalls] = await Promise.all([
    lotsOnHand(db(), user.shopId),
    openReservations(db(), user.shopId),
    lowStock(db(), user.shopId),
    stockShortfalls(db(), user.shopId),
  ]);
  return (
    <AppFrame user={user} current="/office/stock">
      <h1 className="text-3xl font-bold">Stock</h1>
      <p className="mt-2 max-w-3xl text-lg">
        Parts on the shelf by batch and serial number. A part fitted at the bench is drawn from here when its tablet syncs; stock never goes
        below zero — a fit the shelf cannot cover is kept and flagged for the supervisor.
      </p>

      <section className={section} aria-labelledby="receive">
        <h2 id="receive" className="text-2xl font-bold">
          Receive a delivery
        </h2>
        <ReceiveForm />
      </section>

      <section className={section} aria-labelledby="low">
        <h2 id="low" className="text-2xl font-bold">
          Running low
        </h2>
        {low.length === 0 ? (
          <p className="mt-2 text-lg">Nothing is at or below its low-stock level.</p>
        ) : (
          <ul className="mt-2 flex flex-col gap-2" data-testid="low-stock">
            {low.map((l) => (
              <li key={l.itemId} className="rounded-lg border-2 border-fail bg-fail-light px-4 py-2 text-lg">
                <span aria-hidden="true">▼ </span>
                <strong>Low:</strong> <span className="font-mono">{l.partNumber}</span> {l.description} — {l.free} free ({l.onHand} on the
                shelf, {l.reserved} put aside); order at {l.lowAt} or fewer
              </li>
            ))}
          </ul>
        )}
      </section>

      <section className={section} aria-labelledby="shelf">
        <h2 id="shelf" className="text-2xl font-bold">
          On the shelf
        </h2>
        {lots.length === 0 ? (
          <p className="mt-2 text-lg">Nothing in stock yet: receive a delivery above.</p>
        ) : (
          <table className="mt-2 w-full border-collapse text-left" data-testid="on-hand">
            <thead>
              <tr className="border-b-2 border-steel-700">
                <th className={th}>Part</th>
                <th className={th}>Batch / serial</th>
                <th className={th}>Shelf</th>
                <th className={th}>On the shelf</th>
                <th className={th}>Put aside</th>
                <th className={th}>Received</th>
                <th className={th} />
              </tr>
            </thead>
            <tbody>
              {lots.map((l) => (
                <tr key={l.id} className="border-b border-steel-300" data-testid="lot-row">
                  <td className={td}>
                    <span className="font-mono">{l.partNumber}</span> {l.description}
                  </td>
                  <td className={`${td} font-mono`}>{[l.serial, l.batch].filter(Boolean).join(" · ")}</td>
                  <td className={td}>{l.location}</td>
                  <td className={`${td} text-lg font-bold`} data-testid="lot-on-hand">
                    {l.onHand}
                  </td>
                  <td className={td}>{l.reserved}</td>
                  <td className={td}>
                    {formatDay(l.receivedAt)} · {l.supplier}
                  </td>
                  <td className={td}>{l.onHand > l.reserved && <ReserveForm lotId={l.id} label={`${l.partNumber} ${lotName(l)}`} />}</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>

      <section className={section} aria-labelledby="aside">
        <h2 id="aside" className="text-2xl font-bold">
          Put aside for jobs
        </h2>
        {reservations.length === 0 ? (
          <p className="mt-2 text-lg">Nothing is put aside.</p>
        ) : (
          <table className="mt-2 w-full border-collapse text-left">
            <thead>
              <tr className="border-b-2 border-steel-700">
                <th className={th}>Job</th>
                <th className={th}>Part</th>
                <th className={th}>Shelf</th>
                <th className={th}>Still put aside</th>
                <th className={th}>Since</th>
                <th className={th} />
              </tr>
            </thead>
            <tbody>
              {reservations.map((r) => (
                <tr key={r.id} className="border-b border-steel-300">
                  <td className={`${td} font-mono`}>
                    <Link className="underline" href={`/office/work-orders/${r.workOrderId}`}>
                      #{r.workOrderNumber}
                    </Link>
                  </td>
                  <td className={td}>
                    <span className="font-mono">{r.partNumber}</span> {lotName(r)}
                  </td>
                  <td className={td}>{r.location}</td>
                  <td className={td}>
                    {r.outstanding} of {r.quantity}
                  </td>
                  <td className={td}>{formatDay(r.reservedAt)}</td>
                  <td className={td}>
                    <ReleaseForm reservationId={r.id} label={`${r.partNumber} for job #${r.workOrderNumber}`} />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>

      <section className={section} aria-labelledby="short">
        <h2 id="short" className="text-2xl font-bold">
          Fitted beyond the stock on record
        </h2>
        {shortfalls.length === 0 ? (
          <p className="mt-2 text-lg">Every part fitted from stock was on the shelf.</p>
        ) : (
          <ul className="mt-2 flex flex-col gap-2" data-testid="shortfalls">
            {shortfalls.map((s) => (
              <li key={s.id} className="rounded-lg border-2 border-warn bg-warn-light px-4 py-2 text-lg">
                <span aria-hidden="true">⚠ </span>
                <strong>Short {s.short}:</strong> <span className="font-mono">{s.partNumber}</span> {lotName(s)} — {s.fitted} fitted on{" "}
                <Link className="underline" href={`/office/work-orders/${s.workOrderId}`}>
                  job #{s.workOrderNumber}
                </Link>{" "}
                by {s.fittedBy ?? "someone"}, {formatDayTime(s.recordedAt)}. Count the shelf; the supervisor sees the flag on the job.
              </li>
            ))}
          </ul>
        )}
      </section>

      <section className={section} aria-labelledby="search">
        <h2 id="search" className="text-2xl font-bold">
          Batch search
        </h2>
        <p className="mt-1 text-lg">Which bikes got batch X — and where the rest of it is: received, put aside, let go and fitted.</p>
        <StockSearch />
      </section>
    </AppFrame>
  );
}
