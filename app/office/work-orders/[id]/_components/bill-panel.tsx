"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { api, type Wire } from "@/app/ui/api-client";
import { BillTable, type ShownBillLine } from "@/app/ui/bill-table";
import { buttonClass, FormMessage, inputClass } from "@/app/ui/form-field";
import type { BillSource, IssuedBill } from "@/db/office/final-bill";
import { formatHundredthsAsHours } from "@/lib/clock/hours";
import { buildBill, type LabourBasis } from "@/lib/money/final-bill";
import { formatMinor, parseHundredths } from "@/lib/money/quote-totals";

/** The final bill: drawn live from the approved lines and the office's choices, then issued once. */
export function BillPanel({
  workOrderId,
  source,
  issued,
  mayIssue,
  why,
}: {
  workOrderId: string;
  source: Wire<BillSource> | null;
  issued: Wire<IssuedBill> | null;
  mayIssue: boolean;
  why: string;
}) {
  const router = useRouter();
  const [basis, setBasis] = useState<Record<string, LabourBasis>>({});
  const [added, setAdded] = useState<Record<string, string>>({});
  const [busy, setBusy] = useState(false);
  const [message, setMessage] = useState<{ error?: string; ok?: string }>({});
  const addParts = Object.entries(added).map(([ref, price]) => ({ ref, unitPriceMinor: parseHundredths(price) }));
  const badPrice = addParts.some((p) => p.unitPriceMinor === null);
  const draft = source ? draftBill(source, basis, addParts) : null;

  if (issued) {
    const lines: ShownBillLine[] = issued.lines.map((l) => ({
      ...l,
      key: l.id,
      unitPriceMinor: Number(l.unitPriceMinor),
      lineTotalMinor: Number(l.lineTotalMinor),
    }));
    const paid = issued.payments.find((p) => p.status === "paid");
    return (
      <section className="mt-6 rounded-xl border-2 border-steel-700 bg-white p-5" data-testid="bill-panel">
        <h2 className="text-2xl font-bold">Bill {issued.number} — issued</h2>
        <BillTable lines={lines} totals={numbers(issued)} currency={issued.currency} />
        <p className="mt-2 text-lg font-bold" data-testid="bill-paid-state">
          {paid
            ? `✔ Balance paid (${formatMinor(Number(paid.amountMinor), issued.currency)})`
            : Number(issued.balanceDueMinor) > 0
              ? "… Balance not paid yet"
              : "✔ Nothing left to pay"}
        </p>
      </section>
    );
  }
  if (!source || !draft) {
    return (
      <section className="mt-6 rounded-xl border-2 border-steel-700 bg-white p-5" data-testid="bill-panel">
        <h2 className="text-2xl font-bold">Final bill</h2>
        <p className="mt-2 text-lg">{source ? "The bill is larger than Benchtag accepts." : "No approved quote yet: nothing to bill."}</p>
      </section>
    );
  }

  async function issue() {
    setBusy(true);
    setMessage({});
    try {
      if (badPrice) throw new Error("Unit price of an added part: a number with at most two decimals, e.g. 12.50.");
      const r = await api<{ number: number }>("POST", `/api/office/work-orders/${workOrderId}/bill`, {
        labour: Object.entries(basis).map(([lineId, b]) => ({ lineId, basis: b })),
        addParts: addParts.map((p) => ({ partFittedId: p.ref, unitPriceMinor: p.unitPriceMinor })),
      });
      setMessage({ ok: `Bill ${r.number} issued; the customer can pay the balance on their page.` });
      router.refresh();
    } catch (e) {
      setMessage({ error: (e as Error).message });
    } finally {
      setBusy(false);
    }
  }

  const c = source.currency;
  const lines: ShownBillLine[] = draft.lines.map((l) => ({ ...l, key: l.ref }));
  const waiting = source.input.lines.filter((l) => l.answer === "no_answer").length;
  return (
    <section className="mt-6 rounded-xl border-2 border-steel-700 bg-white p-5" data-testid="bill-panel">
      <h2 className="text-2xl font-bold">Final bill — draft</h2>
      <p className="mt-1 text-base">
        Clocked on this job: {formatHundredthsAsHours(source.input.clockedHundredths)}
        {source.clockRunning ? " (a clock is still running)" : ""}. Labour billed as clocked takes its share of these hours, in proportion
        to the quoted hours.
      </p>
      {waiting > 0 && (
        <p className="mt-1 text-lg font-bold text-warn">
          … {waiting} line(s) of extra work still wait for the customer; they are not billed.
        </p>
      )}
      <BillTable
        lines={lines}
        totals={draft}
        currency={c}
        choose={(l) =>
          l.kind === "labour" && l.counted ? (
            <fieldset className="mt-2 flex flex-wrap gap-4" data-testid="labour-choice">
              <legend className="sr-only">Bill {l.description}</legend>
              {(["quoted", "clocked"] as const).map((b) => (
                <label key={b} className="flex min-h-16 items-center gap-3 rounded-lg border-2 border-steel-300 px-3 text-base font-bold">
                  <input
                    type="radio"
                    className="h-7 w-7"
                    name={`basis-${l.key}`}
                    checked={(basis[l.key] ?? "quoted") === b}
                    onChange={() => setBasis((x) => ({ ...x, [l.key]: b }))}
                  />
                  {b === "quoted"
                    ? `As quoted (${formatHundredthsAsHours(l.quotedHundredths)})`
                    : `As clocked (${formatHundredthsAsHours(l.clockedHundredths ?? 0)})`}
                </label>
              ))}
            </fieldset>
          ) : null
        }
      />
      {source.input.fittedUnquoted.length > 0 && (
        <div className="mt-4" data-testid="fitted-unquoted">
          <h3 className="text-xl font-bold">Fitted at the bench, on no quote line</h3>
          {source.input.fittedUnquoted.map((p) => (
            <div key={p.ref} className="mt-2 flex flex-wrap items-center gap-4">
              <label className="flex min-h-16 items-center gap-3 text-lg">
                <input
                  type="checkbox"
                  className="h-8 w-8"
                  checked={p.ref in added}
                  onChange={(e) =>
                    setAdded((a) => {
                      const n = { ...a };
                      if (e.target.checked) n[p.ref] = "";
                      else delete n[p.ref];
                      return n;
                    })
                  }
                />
                Add {p.quantity} × {p.description || p.partNumber} <span className="font-mono">{p.partNumber}</span>
              </label>
              {p.ref in added && (
                <label className="flex items-center gap-2 text-base font-bold">
                  Unit price ({c})
                  <input
                    className={`${inputClass} w-36`}
                    inputMode="decimal"
                    value={added[p.ref]}
                    onChange={(e) => setAdded((a) => ({ ...a, [p.ref]: e.target.value }))}
                  />
                </label>
              )}
            </div>
          ))}
        </div>
      )}
      {mayIssue ? (
        <button type="button" className={`${buttonClass} mt-4`} disabled={busy} onClick={() => void issue()}>
          Issue the bill ({formatMinor(draft.totalMinor, c)})
        </button>
      ) : (
        <p className="mt-4 text-base text-steel-700">{why}</p>
      )}
      <div className="mt-3">
        <FormMessage error={message.error} ok={message.ok} />
      </div>
    </section>
  );
}

const numbers = (b: Wire<IssuedBill>) => ({
  subtotalMinor: Number(b.subtotalMinor),
  taxRateBp: b.taxRateBp,
  taxMinor: Number(b.taxMinor),
  totalMinor: Number(b.totalMinor),
  depositsPaidMinor: Number(b.depositsPaidMinor),
  balanceDueMinor: Number(b.balanceDueMinor),
});

/** The bill as it would be issued now (null when it would be larger than Benchtag accepts). */
function draftBill(
  source: Wire<BillSource>,
  basis: Record<string, LabourBasis>,
  addParts: Array<{ ref: string; unitPriceMinor: number | null }>,
) {
  try {
    const priced = addParts.flatMap((p) => (p.unitPriceMinor === null ? [] : [{ ref: p.ref, unitPriceMinor: p.unitPriceMinor }]));
    return buildBill(source.input, { labour: basis, addParts: priced });
  } catch {
    return null;
  }
}
