"use client";

import { useMutation, useQuery } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { formatMinor } from "@/lib/money/quote-totals";
import { api } from "@/app/ui/api-client";
import type { CustomerQuoteView } from "@/db/office/quotes";
import { buttonClass, FormMessage, inputClass, quietButtonClass } from "@/app/ui/form-field";
import { PaymentStatus } from "./payment-status";

const qty = (h: number) => (h % 100 === 0 ? String(h / 100) : (h / 100).toFixed(2));

// The customer's view of a quote: the lines, the totals, approve, then pay the deposit.
export function CustomerQuote({ quote }: { quote: CustomerQuoteView }) {
  const router = useRouter();
  const [message, setMessage] = useState<{ error?: string; ok?: string }>({});
  const open = quote.deposits.find((d) => d.status === "paid") ?? quote.deposits.find((d) => d.status === "pending");
  const [depositId, setDepositId] = useState<string | null>(open?.id ?? null);
  const c = quote.currency;

  const approve = useMutation({
    mutationFn: () => api("POST", `/api/my-bikes/quotes/${quote.id}/approve`),
    onSuccess: () => {
      setMessage({ ok: "Thank you — quote approved." });
      router.refresh();
    },
    onError: (e) => setMessage({ error: (e as Error).message }),
  });
  const [declining, setDeclining] = useState(false);
  const [comment, setComment] = useState("");
  const decline = useMutation({
    mutationFn: () => api("POST", `/api/my-bikes/quotes/${quote.id}/decline`, { comment }),
    onSuccess: () => {
      setMessage({ ok: "Your answer is with the workshop: quote declined." });
      router.refresh();
    },
    onError: (e) => setMessage({ error: (e as Error).message }),
  });
  const pay = useMutation({
    mutationFn: () => api<{ depositId: string }>("POST", `/api/my-bikes/quotes/${quote.id}/deposit`),
    onSuccess: (r) => {
      setDepositId(r.depositId);
      setMessage({});
    },
    onError: (e) => setMessage({ error: (e as Error).message }),
  });
  const deposit = useQuery({
    queryKey: ["deposit", depositId],
    enabled: Boolean(depositId),
    queryFn: async () =>
      (await api<{ deposit: { status: string; amountMinor: number } }>("GET", `/api/my-bikes/deposits/${depositId}`)).deposit,
    refetchInterval: (q) => (q.state.data?.status === "pending" || !q.state.data ? 1000 : false),
  });
  const depositStatus = deposit.data?.status ?? open?.status;
  const failed = depositStatus === "failed";

  return (
    <div className="mt-3 rounded-lg border-2 border-steel-300 p-3" data-testid="customer-quote">
      <h3 className="text-xl font-bold">
        Quote (version {quote.version}) —{" "}
        {quote.status === "approved" ? "✔ approved" : quote.declined ? "✖ declined by you" : "… waiting for your answer"}
      </h3>
      <table className="mt-2 w-full border-collapse text-left">
        <tbody>
          {quote.lines.map((l) => (
            <tr key={l.id} className="border-b border-steel-300">
              <td className="py-1 pr-2">{l.description}</td>
              <td className="py-1 pr-2 text-right tabular-nums whitespace-nowrap">
                {qty(l.quantityHundredths)} × {formatMinor(l.unitPriceMinor, c)}
              </td>
              <td className="py-1 text-right tabular-nums whitespace-nowrap">{formatMinor(l.lineTotalMinor, c)}</td>
            </tr>
          ))}
          <tr>
            <td colSpan={2} className="pt-2 pr-6 text-right">
              Subtotal
            </td>
            <td className="pt-2 text-right whitespace-nowrap tabular-nums">{formatMinor(quote.subtotalMinor, c)}</td>
          </tr>
          <tr>
            <td colSpan={2} className="pr-6 text-right">
              Tax ({(quote.taxRateBp / 100).toFixed(2)} %)
            </td>
            <td className="text-right whitespace-nowrap tabular-nums">{formatMinor(quote.taxMinor, c)}</td>
          </tr>
          <tr>
            <td colSpan={2} className="pr-6 text-right font-bold">
              Total
            </td>
            <td className="border-t-2 border-steel-700 text-right font-bold tabular-nums" data-testid="customer-quote-total">
              {formatMinor(quote.totalMinor, c)}
            </td>
          </tr>
        </tbody>
      </table>
      {quote.note && <p className="mt-2 italic">{quote.note}</p>}
      {quote.depositMinor > 0 && <p className="mt-2 text-lg">Deposit to start the work: {formatMinor(quote.depositMinor, c)}</p>}
      <div className="mt-3 flex flex-wrap items-center gap-3">
        {quote.status === "sent" && !quote.declined && (
          <button type="button" className={buttonClass} disabled={approve.isPending} onClick={() => approve.mutate()}>
            Approve this quote
          </button>
        )}
        {quote.status === "sent" && !quote.declined && !declining && (
          <button type="button" className={quietButtonClass} onClick={() => setDeclining(true)}>
            Decline this quote
          </button>
        )}
        {quote.declined && (
          <p className="text-lg font-bold text-fail" data-testid="quote-declined">
            ✖ You declined this quote{quote.declined.comment ? `: “${quote.declined.comment}”` : "."} The workshop will be in touch.
          </p>
        )}
        {quote.status === "approved" && quote.depositMinor > 0 && depositStatus !== "paid" && (!depositId || failed) && (
          <button type="button" className={buttonClass} disabled={pay.isPending} onClick={() => pay.mutate()}>
            Pay the deposit ({formatMinor(quote.depositMinor, c)})
          </button>
        )}
        <PaymentStatus status={depositStatus} sent={Boolean(depositId)} paidText="Deposit paid. Thank you." testId="deposit-status" />
      </div>
      {declining && !quote.declined && (
        <div className="mt-3 flex flex-wrap items-end gap-4">
          <label className="flex grow flex-col gap-1 text-base font-bold">
            Comment for the workshop (optional)
            <input className={inputClass} value={comment} onChange={(e) => setComment(e.target.value)} />
          </label>
          <button type="button" className={buttonClass} disabled={decline.isPending} onClick={() => decline.mutate()}>
            Decline the quote
          </button>
        </div>
      )}
      <div className="mt-2">
        <FormMessage error={message.error} ok={message.ok} />
      </div>
    </div>
  );
}
