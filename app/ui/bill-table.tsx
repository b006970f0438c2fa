import { AnswerBadge } from "@/app/ui/answer-badge";
import { MoneyTotals } from "@/app/ui/money-totals";
import { qty } from "@/app/ui/supplement-lines";
import { formatHundredthsAsHours } from "@/lib/clock/hours";
import type { BillLine } from "@/lib/money/final-bill";
import { formatMinor } from "@/lib/money/quote-totals";

/** A bill line as the office's draft and the issued bill both show it (keyed for React). */
export type ShownBillLine = Omit<BillLine, "ref"> & { key: string };

export interface ShownBillTotals {
  subtotalMinor: number;
  taxRateBp: number | null;
  taxMinor: number;
  totalMinor: number;
  depositsPaidMinor: number;
  balanceDueMinor: number;
}

const from = (l: ShownBillLine) =>
  l.source === "quote" ? "Quote" : l.source === "supplement" ? `Extra work ${l.supplementNumber ?? ""}` : "Fitted at the bench";

/** "As quoted: 3.50 h · as clocked: 4.10 h" — both figures, the billed one marked. */
export function LabourFigures({ line }: { line: ShownBillLine }) {
  if (line.kind !== "labour" || !line.counted) return null;
  return (
    <p className="text-base" data-testid="labour-basis">
      Billed <strong>{line.labourBasis === "clocked" ? "as clocked" : "as quoted"}</strong> · quoted{" "}
      {formatHundredthsAsHours(line.quotedHundredths)} · clocked{" "}
      {line.clockedHundredths === null ? "—" : formatHundredthsAsHours(line.clockedHundredths)}
    </p>
  );
}

/** The bill's lines and totals (the rounding rule stated under them). */
export function BillTable({
  lines,
  totals,
  currency,
  choose,
}: {
  lines: ShownBillLine[];
  totals: ShownBillTotals;
  currency: string;
  /** The office's controls for a line (labour basis), drawn under its description. */
  choose?: (l: ShownBillLine) => React.ReactNode;
}) {
  return (
    <div>
      <table className="mt-2 w-full border-collapse text-left text-lg">
        <thead>
          <tr className="border-b-2 border-steel-700 text-base">
            <th className="py-1 pr-2">Line</th>
            <th className="py-1 text-right">Amount</th>
          </tr>
        </thead>
        <tbody>
          {lines.map((l) => (
            <tr key={l.key} className={`border-b border-steel-300 align-top ${l.counted ? "" : "text-steel-700"}`} data-testid="bill-line">
              <td className="py-2 pr-2">
                <span className={l.counted ? "" : "line-through"}>{l.description}</span>
                {l.partNumber && <span className="ml-2 font-mono text-base break-all">{l.partNumber}</span>}
                <p className="text-base">
                  {from(l)} · <AnswerBadge answer={l.answer} />
                </p>
                {choose ? choose(l) : <LabourFigures line={l} />}
              </td>
              <td className="py-2 text-right">
                <span className="font-bold whitespace-nowrap tabular-nums">
                  {l.counted ? formatMinor(l.lineTotalMinor, currency) : "not billed"}
                </span>
                {l.counted && (
                  <span className="block text-base tabular-nums">
                    {qty(l.quantityHundredths)}
                    {l.kind === "labour" ? " h" : ""} × {formatMinor(l.unitPriceMinor, currency)}
                  </span>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      <div className="mt-3">
        <MoneyTotals
          currency={currency}
          testId="bill-totals"
          rows={[
            { label: "Subtotal", minor: totals.subtotalMinor },
            { label: `Tax (${((totals.taxRateBp ?? 0) / 100).toFixed(2)} %)`, minor: totals.taxMinor },
            { label: "Total", minor: totals.totalMinor, strong: true, testId: "bill-total" },
            { label: "Deposit paid", minor: -totals.depositsPaidMinor },
            {
              label: totals.balanceDueMinor < 0 ? "To give back" : "Balance due",
              minor: Math.abs(totals.balanceDueMinor),
              strong: true,
              testId: "bill-balance",
            },
          ]}
        />
      </div>
      <p className="mt-2 text-base text-steel-700">
        Rounding: each line is quantity × price rounded half up to the penny; tax is charged once on the subtotal, rounded half up.
      </p>
    </div>
  );
}
