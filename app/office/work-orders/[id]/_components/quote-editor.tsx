"use client";

import { issuesOf } from "@/lib/zod-issues";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { useState } from "react";
import { formatMinor, parseHundredths, quoteTotals } from "@/lib/money/quote-totals";
import { quoteDraftSchema } from "@/lib/office/schemas";
import { api, ApiError, fieldErrors } from "@/app/ui/api-client";
import { buttonClass, FormMessage, inputClass, quietButtonClass } from "@/app/ui/form-field";
import type { Quote, WorkOrderData } from "./types";
import { MoneyTotals } from "@/app/ui/money-totals";

interface LineText {
  kind: "part" | "labour";
  description: string;
  partNumber: string;
  quantity: string;
  unitPrice: string;
}

const toText = (minor: number) => `${Math.floor(minor / 100)}.${String(minor % 100).padStart(2, "0")}`;
const blank = (): LineText => ({ kind: "part", description: "", partNumber: "", quantity: "1", unitPrice: "" });

const QUOTE_STATUS = {
  draft: "Draft (not sent)",
  sent: "Sent — waiting for the customer",
  approved: "Approved by the customer",
  superseded: "Replaced by a newer version",
} as const;

// Writing the quote: lines of parts and labour, totals worked out as you type with the same rule
// as the server (tax once on the subtotal, half-up), a deposit, then "send to the customer".
export function QuoteEditor({ data, currency, taxRateBp }: { data: WorkOrderData; currency: string; taxRateBp: number }) {
  const qc = useQueryClient();
  const wo = data.workOrder;
  const draft = data.quotes.find((q) => q.status === "draft");
  const current = data.quotes.find((q) => q.status === "sent" || q.status === "approved");
  const editable = ["booked_in", "inspected", "quoted"].includes(wo.status);
  const start = draft ?? current;
  const [lines, setLines] = useState<LineText[]>(
    start?.lines.map((l) => ({
      kind: l.kind,
      description: l.description,
      partNumber: l.partNumber ?? "",
      quantity: toText(l.quantityHundredths),
      unitPrice: toText(l.unitPriceMinor),
    })) ?? [blank()],
  );
  const [deposit, setDeposit] = useState(start ? toText(start.depositMinor) : "0.00");
  const [note, setNote] = useState(start?.note ?? "");
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [message, setMessage] = useState<{ error?: string; ok?: string }>({});

  const asDraft = () => ({
    lines: lines.map((l) => ({
      kind: l.kind,
      description: l.description,
      partNumber: l.partNumber,
      quantityHundredths: parseHundredths(l.quantity) ?? Number.NaN,
      unitPriceMinor: parseHundredths(l.unitPrice) ?? Number.NaN,
    })),
    depositMinor: parseHundredths(deposit) ?? Number.NaN,
    note,
  });
  const parsed = quoteDraftSchema.safeParse(asDraft());
  const live = parsed.success ? quoteTotals(parsed.data.lines, taxRateBp) : null;

  const save = useMutation({
    mutationFn: async (send: boolean) => {
      const p = quoteDraftSchema.safeParse(asDraft());
      if (!p.success) throw new ApiError("Check the marked fields.", 400, issuesOf(p.error));
      await api("PUT", `/api/office/work-orders/${wo.id}/quote`, p.data);
      if (send) return api<{ mail: { ok: boolean; error?: string } }>("POST", `/api/office/work-orders/${wo.id}/quote/send`);
      return null;
    },
    onSuccess: (r) => {
      setErrors({});
      setMessage({
        ok: r
          ? `Quote sent.${r.mail.ok ? " The e-mail to the customer is on its way." : ` E-mail not sent: ${r.mail.error}.`}`
          : "Draft saved.",
      });
      void qc.invalidateQueries({ queryKey: ["work-order", wo.id] });
    },
    onError: (e) => {
      if (e instanceof ApiError) setErrors(fieldErrors(e.issues));
      setMessage({ error: (e as Error).message });
    },
  });

  const set = (i: number, patch: Partial<LineText>) => setLines((ls) => ls.map((l, j) => (j === i ? { ...l, ...patch } : l)));
  const err = (i: number, f: string) => errors[`lines.${i}.${f}`];

  return (
    <section className="rounded-xl border-2 border-steel-700 bg-white p-4" aria-labelledby="quote-heading" data-testid="quote-section">
      <h2 id="quote-heading" className="text-2xl font-bold">
        Quote
      </h2>
      {data.quotes.length === 0 && !editable && <p className="mt-1 text-lg">No quote was made for this job.</p>}
      {data.quotes.length > 0 && (
        <ul className="mt-2 space-y-1">
          {data.quotes.map((q) => (
            <QuoteSummary key={q.id} q={q} />
          ))}
        </ul>
      )}
      {editable ? (
        <div className="mt-4">
          <h3 className="text-lg font-bold">
            {draft ? `Draft version ${draft.version}` : current ? "Revise the quote (a new version)" : "New quote"}
          </h3>
          <div className="mt-2 overflow-x-auto">
            <table className="w-full border-collapse text-left">
              <thead>
                <tr className="border-b-2 border-steel-700">
                  <th className="pr-2">Type</th>
                  <th className="pr-2">Description</th>
                  <th className="pr-2">Part no.</th>
                  <th className="pr-2">Qty / hours</th>
                  <th className="pr-2">Unit price</th>
                  <th className="pr-2 text-right">Line</th>
                  <th />
                </tr>
              </thead>
              <tbody>
                {lines.map((l, i) => (
                  <tr key={i} className="border-b border-steel-300 align-top" data-testid="quote-line">
                    <td className="py-1 pr-2">
                      <select
                        aria-label={`Line ${i + 1} type`}
                        value={l.kind}
                        onChange={(e) => set(i, { kind: e.target.value as LineText["kind"] })}
                        className={inputClass}
                      >
                        <option value="part">Part</option>
                        <option value="labour">Labour</option>
                      </select>
                    </td>
                    <td className="py-1 pr-2">
                      <input
                        aria-label={`Line ${i + 1} description`}
                        value={l.description}
                        onChange={(e) => set(i, { description: e.target.value })}
                        className={`${inputClass} w-full min-w-48`}
                        aria-invalid={Boolean(err(i, "description"))}
                      />
                      {err(i, "description") && <p className="font-bold text-fail">✖ {err(i, "description")}</p>}
                    </td>
                    <td className="py-1 pr-2">
                      <input
                        aria-label={`Line ${i + 1} part number`}
                        value={l.partNumber}
                        onChange={(e) => set(i, { partNumber: e.target.value })}
                        className={`${inputClass} w-32 font-mono`}
                      />
                    </td>
                    <td className="py-1 pr-2">
                      <input
                        aria-label={`Line ${i + 1} quantity`}
                        value={l.quantity}
                        onChange={(e) => set(i, { quantity: e.target.value })}
                        inputMode="decimal"
                        className={`${inputClass} w-24 font-mono`}
                        aria-invalid={Boolean(err(i, "quantityHundredths"))}
                      />
                      {err(i, "quantityHundredths") && <p className="font-bold text-fail">✖ use a number with up to 2 decimals, above 0</p>}
                    </td>
                    <td className="py-1 pr-2">
                      <input
                        aria-label={`Line ${i + 1} unit price`}
                        value={l.unitPrice}
                        onChange={(e) => set(i, { unitPrice: e.target.value })}
                        inputMode="decimal"
                        className={`${inputClass} w-28 font-mono`}
                        aria-invalid={Boolean(err(i, "unitPriceMinor"))}
                      />
                      {err(i, "unitPriceMinor") && <p className="font-bold text-fail">✖ enter a price like 68.00</p>}
                    </td>
                    <td className="py-1 pr-2 text-right tabular-nums whitespace-nowrap">
                      {live ? formatMinor(live.lineTotals[i], currency) : "—"}
                    </td>
                    <td className="py-1">
                      <button
                        type="button"
                        aria-label={`Remove line ${i + 1}`}
                        className="min-h-12 min-w-12 rounded-lg border-2 border-steel-300 font-bold"
                        onClick={() => setLines((ls) => ls.filter((_, j) => j !== i))}
                        disabled={lines.length === 1}
                      >
                        ✕
                      </button>
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          {errors.lines && <p className="font-bold text-fail">✖ {errors.lines}</p>}
          <button type="button" className={`${quietButtonClass} mt-2`} onClick={() => setLines((ls) => [...ls, blank()])}>
            + Add a line
          </button>
          <div className="mt-4 grid gap-4 md:grid-cols-2">
            <MoneyTotals
              testId="quote-totals"
              currency={currency}
              rows={[
                { label: "Subtotal", minor: live ? live.subtotalMinor : null },
                { label: `Tax (${(taxRateBp / 100).toFixed(2)} %)`, minor: live ? live.taxMinor : null },
                { label: "Total", minor: live ? live.totalMinor : null, strong: true, testId: "quote-total" },
              ]}
            />
            <div className="grid gap-3">
              <label className="flex flex-col gap-1 font-bold">
                Deposit asked
                <input
                  aria-invalid={Boolean(errors.depositMinor)}
                  value={deposit}
                  onChange={(e) => setDeposit(e.target.value)}
                  inputMode="decimal"
                  className={`${inputClass} w-40 font-mono font-normal`}
                />
              </label>
              {errors.depositMinor && <p className="font-bold text-fail">✖ {errors.depositMinor}</p>}
              <label className="flex flex-col gap-1 font-bold">
                Note to the customer
                <textarea value={note} onChange={(e) => setNote(e.target.value)} rows={2} className={`${inputClass} py-2 font-normal`} />
              </label>
            </div>
          </div>
          <div className="mt-3">
            <FormMessage error={message.error} ok={message.ok} />
          </div>
          <div className="mt-3 flex flex-wrap gap-3">
            <button type="button" className={quietButtonClass} disabled={save.isPending} onClick={() => save.mutate(false)}>
              Save draft
            </button>
            <button
              type="button"
              className={buttonClass}
              disabled={save.isPending || wo.status === "booked_in"}
              onClick={() => save.mutate(true)}
            >
              Send to the customer
            </button>
          </div>
          {wo.status === "booked_in" && <p className="mt-2">Move the job to Inspected before sending the quote.</p>}
        </div>
      ) : (
        current && <QuoteLines q={current} />
      )}
      {data.invoice && (
        <div className="mt-4 rounded-lg border-2 border-pass bg-pass-light p-3" data-testid="invoice">
          <h3 className="text-lg font-bold">Final invoice {data.invoice.number}</h3>
          <MoneyTotals
            currency={data.invoice.currency}
            rows={[
              { label: "Total", minor: data.invoice.totalMinor },
              { label: "Deposit paid", minor: data.invoice.depositsPaidMinor },
              { label: "Balance due", minor: data.invoice.balanceDueMinor, strong: true },
            ]}
          />
        </div>
      )}
    </section>
  );
}

function QuoteLines({ q }: { q: Quote }) {
  const c = q.currency;
  return (
    <table className="mt-3 w-full border-collapse text-left" data-testid="quote-lines">
      <tbody>
        {q.lines.map((l) => (
          <tr key={l.id} className="border-b border-steel-300">
            <td className="py-1 pr-2">{l.kind === "labour" ? "Labour" : "Part"}</td>
            <td className="py-1 pr-2">
              {l.description} {l.partNumber && <span className="font-mono text-steel-700">{l.partNumber}</span>}
            </td>
            <td className="py-1 pr-2 text-right tabular-nums whitespace-nowrap">
              {(l.quantityHundredths / 100).toFixed(2)} × {formatMinor(l.unitPriceMinor, c)}
            </td>
            <td className="py-1 text-right tabular-nums whitespace-nowrap">{formatMinor(l.lineTotalMinor, c)}</td>
          </tr>
        ))}
        <tr>
          <td colSpan={4} className="pt-3">
            <MoneyTotals
              currency={c}
              rows={[
                { label: "Subtotal", minor: q.subtotalMinor },
                { label: `Tax (${(q.taxRateBp / 100).toFixed(2)} %)`, minor: q.taxMinor },
                { label: "Total", minor: q.totalMinor, strong: true },
              ]}
            />
          </td>
        </tr>
      </tbody>
    </table>
  );
}

function QuoteSummary({ q }: { q: Quote }) {
  const paid = q.deposits.filter((d) => d.status === "paid").reduce((a, d) => a + d.amountMinor, 0);
  const pending = q.deposits.some((d) => d.status === "pending");
  // given back at the provider: in part on a paid deposit, or in full (the deposit no longer counts)
  const refunded = q.deposits.filter((d) => d.status === "paid" || d.status === "refunded").reduce((a, d) => a + d.refundedMinor, 0);
  const wholeRefund = paid === 0 && q.deposits.some((d) => d.status === "refunded");
  return (
    <li className="flex flex-wrap items-center gap-3 text-lg" data-testid="quote-version">
      <span className="font-bold">v{q.version}</span>
      <span>{QUOTE_STATUS[q.status]}</span>
      <span className="tabular-nums">{formatMinor(q.totalMinor, q.currency)}</span>
      {q.depositMinor > 0 && (
        <span
          data-testid="deposit-state"
          className={`rounded border-2 px-2 font-bold ${paid >= q.depositMinor ? "border-pass text-pass" : "border-warn text-warn"}`}
        >
          {paid >= q.depositMinor
            ? `✔ Deposit ${formatMinor(paid, q.currency)} paid${refunded > 0 ? `, ${formatMinor(refunded, q.currency)} of it refunded` : ""}`
            : wholeRefund && !pending
              ? `↩ Deposit ${formatMinor(refunded, q.currency)} refunded: not paid now`
              : pending
                ? `… Deposit ${formatMinor(q.depositMinor, q.currency)} pending`
                : `○ Deposit ${formatMinor(q.depositMinor, q.currency)} not paid`}
        </span>
      )}
    </li>
  );
}
