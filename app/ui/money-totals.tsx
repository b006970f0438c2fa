import { formatMinor } from "@/lib/money/quote-totals";

export interface MoneyRow {
  label: string;
  /** Integer minor units (pence, cents); null shows a dash. */
  minor: number | null;
  strong?: boolean;
  testId?: string;
}

/**
 * Money totals as the office and the customer read them: one row each, label on the left, the
 * figure right-aligned in tabular digits so the pounds and pence line up, the total set apart.
 */
export function MoneyTotals({ rows, currency, testId }: { rows: readonly MoneyRow[]; currency: string; testId?: string }) {
  return (
    <table className="ml-auto border-collapse text-lg" data-testid={testId}>
      <tbody>
        {rows.map((r) => (
          <tr key={r.label} className={r.strong ? "border-t-2 border-steel-700" : undefined}>
            <th scope="row" className={`py-1 pr-8 text-right ${r.strong ? "font-bold" : "font-normal"}`}>
              {r.label}
            </th>
            <td className={`py-1 text-right whitespace-nowrap tabular-nums ${r.strong ? "font-bold" : ""}`} data-testid={r.testId}>
              {r.minor === null ? "—" : formatMinor(r.minor, currency)}
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
