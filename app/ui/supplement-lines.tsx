import type { Wire } from "@/app/ui/api-client";
import { AnswerBadge } from "@/app/ui/answer-badge";
import type { SupplementView } from "@/db/office/supplements";
import { formatDayTime } from "@/lib/format/dates";
import { formatMinor } from "@/lib/money/quote-totals";

/** "2", "1.50": a quantity kept in hundredths. */
export const qty = (h: number) => (h % 100 === 0 ? String(h / 100) : (h / 100).toFixed(2));

/** The lines of one piece of extra work with each answer (shared by the office and the customer). */
export function SupplementLines({ supplement, currency }: { supplement: Wire<SupplementView>; currency: string }) {
  return (
    <table className="mt-2 w-full border-collapse text-left text-lg">
      <tbody>
        {supplement.lines.map((l) => (
          <tr key={l.id} className="border-b border-steel-300 align-top" data-testid="supplement-line">
            <td className="py-2 pr-2">
              {l.description}
              {l.partNumber && <span className="ml-2 font-mono text-base break-all text-steel-700">{l.partNumber}</span>}
              <p className="text-base">
                <AnswerBadge answer={l.answer?.decision ?? null} />
                {l.answer && <span className="ml-2 text-sm text-steel-700">{formatDayTime(l.answer.at)}</span>}
              </p>
              {l.answer?.comment && <p className="text-base italic">“{l.answer.comment}”</p>}
            </td>
            <td className="py-2 text-right">
              <span className="font-bold whitespace-nowrap tabular-nums">{formatMinor(Number(l.lineTotalMinor), currency)}</span>
              <span className="block text-base tabular-nums">
                {qty(l.quantityHundredths)}
                {l.kind === "labour" ? " h" : ""} × {formatMinor(Number(l.unitPriceMinor), currency)}
              </span>
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
