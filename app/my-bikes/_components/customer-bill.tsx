"use client";

import { useMutation, useQuery } from "@tanstack/react-query";
import { useState } from "react";
import { api, type Wire } from "@/app/ui/api-client";
import { BillTable, type ShownBillLine } from "@/app/ui/bill-table";
import { buttonClass, FormMessage } from "@/app/ui/form-field";
import type { IssuedBill } from "@/db/office/final-bill";
import { formatMinor } from "@/lib/money/quote-totals";
import { PaymentStatus } from "./payment-status";

// The customer's issued bill: every line (declined ones marked, not billed), labour as quoted or as
// clocked, the deposit taken off, and the balance paid through the payment service.
export function CustomerBill({ bill }: { bill: Wire<IssuedBill> }) {
  const c = bill.currency;
  const balance = Number(bill.balanceDueMinor);
  const open = bill.payments.find((p) => p.status === "pending" || p.status === "paid");
  const [paymentId, setPaymentId] = useState<string | null>(open?.id ?? null);
  const [error, setError] = useState<string | null>(null);
  const pay = useMutation({
    mutationFn: () => api<{ balancePaymentId: string }>("POST", `/api/my-bikes/bills/${bill.id}/balance`),
    onSuccess: (r) => {
      setPaymentId(r.balancePaymentId);
      setError(null);
    },
    onError: (e) => setError((e as Error).message),
  });
  const payment = useQuery({
    queryKey: ["balance-payment", paymentId],
    enabled: Boolean(paymentId),
    queryFn: async () => (await api<{ payment: { status: string } }>("GET", `/api/my-bikes/balance-payments/${paymentId}`)).payment,
    refetchInterval: (q) => (q.state.data?.status === "pending" || !q.state.data ? 1000 : false),
  });
  const status = payment.data?.status ?? open?.status;
  const lines: ShownBillLine[] = bill.lines.map((l) => ({
    ...l,
    key: l.id,
    unitPriceMinor: Number(l.unitPriceMinor),
    lineTotalMinor: Number(l.lineTotalMinor),
  }));
  return (
    <div className="mt-3 rounded-lg border-2 border-steel-700 p-3" data-testid="customer-bill">
      <h3 className="text-xl font-bold">Bill {bill.number}</h3>
      <BillTable
        lines={lines}
        currency={c}
        totals={{
          subtotalMinor: Number(bill.subtotalMinor),
          taxRateBp: bill.taxRateBp,
          taxMinor: Number(bill.taxMinor),
          totalMinor: Number(bill.totalMinor),
          depositsPaidMinor: Number(bill.depositsPaidMinor),
          balanceDueMinor: balance,
        }}
      />
      <div className="mt-3 flex flex-wrap items-center gap-4">
        {balance > 0 && status !== "paid" && (!paymentId || status === "failed") && (
          <button type="button" className={buttonClass} disabled={pay.isPending} onClick={() => pay.mutate()}>
            Pay the balance ({formatMinor(balance, c)})
          </button>
        )}
        <PaymentStatus
          status={status}
          sent={Boolean(paymentId)}
          paidText="Balance paid. Thank you — a receipt is on its way by e-mail."
          testId="balance-status"
        />
      </div>
      <FormMessage error={error} />
    </div>
  );
}
