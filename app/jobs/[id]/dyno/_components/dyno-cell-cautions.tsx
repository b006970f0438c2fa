import { DYNO_CELL_CAUTIONS } from "@/lib/dyno/cell-cautions";

// The dyno cell's cautions, folded once read; they open again on the next visit.
export function DynoCellCautions() {
  return (
    <details className="rounded-xl border-4 border-warn bg-warn-light p-3 text-ink" data-testid="dyno-cautions" open>
      <summary className="flex min-h-target cursor-pointer items-center gap-2 text-xl font-bold text-warn">
        <span aria-hidden="true">⚠</span> Caution: before any pull in the dyno cell
      </summary>
      <ul className="mt-2 flex list-disc flex-col gap-1 pl-6 text-lg">
        {DYNO_CELL_CAUTIONS.map((c) => (
          <li key={c}>{c}</li>
        ))}
      </ul>
      <p className="mt-2 text-base">Common practice; the cell&apos;s own rules and the dyno maker&apos;s instructions come first.</p>
    </details>
  );
}
