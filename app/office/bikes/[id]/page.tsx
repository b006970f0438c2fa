import type { Metadata } from "next";
import { buttonClass } from "@/app/ui/form-field";
import { handedOverJobOfBike } from "@/db/aftercare/come-backs";
import { isClosed } from "@/lib/work-orders/status";
import Link from "next/link";
import { notFound } from "next/navigation";
import { z } from "zod";
import { requirePageArea } from "@/app/_server/session";
import { AppFrame } from "@/app/ui/app-frame";
import { StatusBadge } from "@/app/ui/status-badge";
import { TagQr } from "@/app/ui/tag-qr";
import { formatDay } from "@/lib/format/dates";
import { db } from "@/db/setup/client";
import { bikeRecord } from "@/db/records/bike-record";
import { canReach } from "@/lib/auth/roles";

export const metadata: Metadata = { title: "Bike record" };

const VERDICT = { in: "✔ in spec", low: "▼ low", high: "▲ high" } as const;

// A bike's whole record: tag, owner (contact only for office and supervisors), every work order,
// every part fitted and every current reading.
export default async function BikePage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requirePageArea("bike-records");
  const id = z.uuid().safeParse((await params).id);
  const rec = id.success ? await bikeRecord(db(), user.shopId, id.data) : null;
  if (!rec) notFound();
  const { bike, workOrders, parts, measurements, withdrawn } = rec;
  const office = canReach(user.role, "office");
  const contact = canReach(user.role, "customer-contact");
  // a handed-over bike with nothing open: offer a come-back of its last job (office and supervisors)
  const comeBackFrom =
    canReach(user.role, "come-backs") && !workOrders.some((w) => !isClosed(w.status))
      ? await handedOverJobOfBike(db(), user.shopId, bike.id)
      : null;
  return (
    <AppFrame user={user} current="/office/customers">
      <div className="flex flex-wrap items-start gap-6">
        <div className="flex-1">
          <h1 className="text-3xl font-bold">
            {bike.make} {bike.model} {bike.year ? `(${bike.year})` : ""}
          </h1>
          <dl className="mt-3 grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-lg">
            <dt className="font-bold">Owner</dt>
            <dd>
              {office ? (
                <Link className="underline" href={`/office/customers/${bike.customerId}`}>
                  {bike.customerName}
                </Link>
              ) : (
                bike.customerName
              )}
            </dd>
            {contact && (
              <>
                <dt className="font-bold">E-mail</dt>
                <dd data-testid="owner-email">{bike.customerEmail ?? "—"}</dd>
                <dt className="font-bold">Phone</dt>
                <dd>{bike.customerPhone ?? "—"}</dd>
              </>
            )}
            <dt className="font-bold">Engine</dt>
            <dd>
              {bike.displacementCc ? `${bike.displacementCc} cc` : "—"} {bike.engineNumber ? `· no. ${bike.engineNumber}` : ""}
            </dd>
            <dt className="font-bold">VIN</dt>
            <dd className="font-mono">{bike.vin ?? "—"}</dd>
            <dt className="font-bold">Colour</dt>
            <dd>{bike.colour ?? "—"}</dd>
          </dl>
          {office && (
            <p className="mt-4 flex flex-wrap gap-3">
              <Link
                href={`/office/work-orders/new?bike=${bike.id}`}
                className="flex min-h-12 items-center rounded-lg bg-steel-900 px-4 font-bold text-white"
              >
                Book this bike in
              </Link>
              <Link
                href={`/office/labels?bike=${bike.id}`}
                className="flex min-h-12 items-center rounded-lg border-2 border-steel-700 px-4 font-bold"
              >
                Print its tag label
              </Link>
            </p>
          )}
        </div>
        <TagQr tagCode={bike.tagCode} />
      </div>

      <section className="mt-8">
        <h2 className="text-2xl font-bold">Work orders</h2>
        {comeBackFrom && (
          <p className="mt-2">
            <Link
              href={`/come-backs/new?original=${comeBackFrom.workOrderId}`}
              className={`${buttonClass} inline-flex min-h-16 items-center`}
              data-testid="bike-come-back-link"
            >
              Back with a fault? Open a come-back of job #{comeBackFrom.number}
            </Link>
          </p>
        )}
        {workOrders.length === 0 && <p className="mt-2">None yet.</p>}
        <ul className="mt-2 space-y-2">
          {workOrders.map((w) => (
            <li key={w.id} className="flex flex-wrap items-center gap-3 text-lg" data-testid="bike-work-order">
              <span className="font-mono font-bold">#{w.number}</span>
              {office ? (
                <Link className="underline" href={`/office/work-orders/${w.id}`}>
                  {w.title}
                </Link>
              ) : (
                w.title
              )}
              <StatusBadge status={w.status} />
              <span className="text-steel-700">
                booked in {formatDay(w.createdAt)}
                {w.odometerKm !== null ? ` at ${w.odometerKm.toLocaleString("en-GB")} km` : ""}
              </span>
            </li>
          ))}
        </ul>
      </section>

      <section className="mt-8">
        <h2 className="text-2xl font-bold">Parts fitted</h2>
        {parts.length === 0 ? (
          <p className="mt-2">None recorded.</p>
        ) : (
          <table className="mt-2 w-full border-collapse text-left">
            <thead>
              <tr className="border-b-2 border-steel-700">
                <th className="py-1 pr-3">Job</th>
                <th className="py-1 pr-3">Part</th>
                <th className="py-1 pr-3">Supplier</th>
                <th className="py-1 pr-3">Serial / batch</th>
                <th className="py-1 pr-3">Step</th>
                <th className="py-1 pr-3">Fitted</th>
              </tr>
            </thead>
            <tbody>
              {parts.map((p) => (
                <tr key={p.id} className={`border-b border-steel-300 ${p.withdrawnReason !== null ? "text-steel-700" : ""}`}>
                  <td className="py-1 pr-3 font-mono">#{p.workOrderNumber}</td>
                  <td className="py-1 pr-3">
                    <span className={p.withdrawnReason !== null ? "line-through" : ""}>
                      {p.quantity} × <span className="font-mono">{p.partNumber}</span> {p.description}
                    </span>
                    {p.withdrawnReason !== null && (
                      <span className="block font-bold text-fail">⊘ withdrawn: “{p.withdrawnReason}” (see Withdrawn entries)</span>
                    )}
                  </td>
                  <td className="py-1 pr-3">{p.supplier || "—"}</td>
                  <td className="py-1 pr-3 font-mono">
                    {[p.serial && `S ${p.serial}`, p.batch && `B ${p.batch}`].filter(Boolean).join(" · ") || "—"}
                  </td>
                  <td className="py-1 pr-3">{p.stepTitle ?? "—"}</td>
                  <td className="py-1 pr-3">{formatDay(p.fittedAt)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>

      <section className="mt-8">
        <h2 className="text-2xl font-bold">Measurements recorded</h2>
        {measurements.length > 0 && (
          <p className="mt-1">
            <a className="font-bold underline" href={`/api/office/bikes/${bike.id}/readings`} download>
              Download every reading as CSV
            </a>{" "}
            (values exactly as typed, corrected readings included)
          </p>
        )}
        {measurements.length === 0 ? (
          <p className="mt-2">None recorded yet.</p>
        ) : (
          <table className="mt-2 w-full border-collapse text-left">
            <thead>
              <tr className="border-b-2 border-steel-700">
                <th className="py-1 pr-3">Job</th>
                <th className="py-1 pr-3">Reading</th>
                <th className="py-1 pr-3">Value</th>
                <th className="py-1 pr-3">Spec</th>
                <th className="py-1 pr-3">Verdict</th>
              </tr>
            </thead>
            <tbody>
              {measurements.map((m) => (
                <tr key={m.id} className="border-b border-steel-300">
                  <td className="py-1 pr-3 font-mono">#{m.workOrderNumber}</td>
                  <td className="py-1 pr-3">
                    {m.label} {m.readingIndex > 0 ? `(${m.readingIndex + 1})` : ""}
                  </td>
                  <td className="py-1 pr-3 font-mono">
                    {m.value} {m.unit}
                  </td>
                  <td className="py-1 pr-3 font-mono">
                    {m.min}–{m.max}
                  </td>
                  <td className="py-1 pr-3 font-bold">
                    {VERDICT[m.verdict]}{" "}
                    {m.superseded && <span className="font-normal text-steel-700">(corrected by a later reading)</span>}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>

      <section className="mt-8" aria-label="Withdrawn entries">
        <h2 className="text-2xl font-bold">Withdrawn entries</h2>
        {withdrawn.length === 0 ? (
          <p className="mt-2">None.</p>
        ) : (
          <ul className="mt-2 space-y-2" data-testid="withdrawn-entries">
            {withdrawn.map((w) => (
              <li key={w.id} className="rounded-lg border-2 border-fail bg-fail-light p-2">
                <span className="font-mono font-bold">#{w.workOrderNumber}</span> <span className="line-through">{w.what}</span>
                <span className="block">
                  Recorded by {w.recordedBy}, {formatDay(w.recordedAt)} · ⊘ withdrawn by {w.withdrawnBy}, {formatDay(w.withdrawnAt)}: “
                  {w.reason}”
                </span>
              </li>
            ))}
          </ul>
        )}
      </section>
    </AppFrame>
  );
}
