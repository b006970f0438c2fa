import Link from "next/link";
import type { openGiveBacks } from "@/db/office/give-backs";
import { formatDayTime } from "@/lib/format/dates";
import { formatMinor } from "@/lib/money/quote-totals";
import { GiveBackButton } from "./give-back-button";

type GiveBack = Awaited<ReturnType<typeof openGiveBacks>>[number];

// Money the payment provider took that the shop must give back (a payment that went through after
// another had paid the same thing, a deposit paid on a closed job). The office refunds it in the
// provider's dashboard or asks the provider from here; the line goes once the provider reports
// the refund in full.
export function MoneyToGiveBack({ rows, timeZone }: { rows: GiveBack[]; timeZone: string }) {
  if (!rows.length) return null;
  return (
    <section className="mt-6 rounded-xl border-2 border-steel-900 bg-white p-4" data-testid="money-to-give-back">
      <h2 className="text-2xl font-bold">
        <span aria-hidden="true">↩ </span>Money to give back ({rows.length})
      </h2>
      <p className="text-base text-steel-700">
        Give each one back through the payment provider; it leaves this list when the provider reports the refund in full.
      </p>
      <ul className="mt-2 grid gap-3">
        {rows.map((g) => (
          <li key={g.id} className="text-lg" data-testid="give-back">
            <Link href={`/office/work-orders/${g.workOrderId}`} className="font-bold underline">
              Job #{g.number}
            </Link>{" "}
            · {g.paymentFor === "deposit" ? "deposit" : "bill payment"} of {formatMinor(g.amountMinor, g.currency)} taken{" "}
            {formatDayTime(g.recordedAt, timeZone)}: {g.reason}
            {g.givenBackMinor > 0 && <> {formatMinor(g.givenBackMinor, g.currency)} given back so far.</>}{" "}
            <span className="font-mono text-base">{g.paymentIntentId}</span>
            <GiveBackButton id={g.id} label={`Give back ${formatMinor(g.amountMinor - g.givenBackMinor, g.currency)} now`} />
          </li>
        ))}
      </ul>
    </section>
  );
}
