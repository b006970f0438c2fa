import type { CautionKind } from "@/lib/procedures/template-schema";

const KIND_LABEL: Record<CautionKind, string> = {
  hot: "Hot parts",
  boost: "Boost pressure",
  fuel: "Fuel",
  lifting: "Lifting",
  "torque-to-yield": "Stretch bolts (torque-to-yield)",
  chemical: "Chemicals",
  general: "Caution",
};

/** The cautions of a step: a block that cannot be missed, acknowledged before the step is done. */
export function Cautions({
  cautions,
  acknowledged,
  onAcknowledge,
}: {
  cautions: Array<{ kind: CautionKind; text: string }>;
  acknowledged: boolean;
  onAcknowledge: () => void;
}) {
  if (!cautions.length) return null;
  return (
    <section aria-label="Cautions" className="rounded-xl border-4 border-ink bg-signal p-4 text-ink">
      <ul className="flex flex-col gap-3">
        {cautions.map((c, i) => (
          <li key={i} className="text-xl">
            <span className="mr-2 inline-flex items-center gap-1 rounded bg-ink px-2 py-0.5 text-base font-bold uppercase tracking-wide text-signal">
              <span aria-hidden="true">⚠</span> {KIND_LABEL[c.kind]}
            </span>
            {c.text}
          </li>
        ))}
      </ul>
      <p className="mt-3 text-base">These notes never replace the maker&apos;s service data, local rules or licensed practice.</p>
      {acknowledged ? (
        <p className="mt-3 text-lg font-bold">✔ Read and understood</p>
      ) : (
        <button
          type="button"
          onClick={onAcknowledge}
          className="mt-3 min-h-target w-full rounded-xl border-4 border-ink bg-white text-xl font-bold"
        >
          I have read these cautions
        </button>
      )}
    </section>
  );
}
