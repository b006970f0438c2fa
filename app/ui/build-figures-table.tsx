import type { BuildFigures } from "@/lib/build-figures";
import { buildFigureRows, figureUsedText } from "@/lib/build-figures/figure-rows";

/** The build's own figures beside the targets, with what they were worked from and what is missing (job page and review). */
export function BuildFiguresTable({ figures, title = "The build's own figures" }: { figures: BuildFigures; title?: string }) {
  return (
    <section aria-labelledby="bf-h" className="rounded-xl border-2 border-steel-300 bg-white p-4" data-testid="build-figures">
      <h2 id="bf-h" className="text-2xl font-bold">
        {title}
      </h2>
      <table className="mt-3 w-full text-left text-lg">
        <thead>
          <tr>
            <th>Figure</th>
            <th>This build</th>
            <th>Target (build sheet)</th>
          </tr>
        </thead>
        <tbody>
          {buildFigureRows(figures).map((r) => (
            <tr key={r.label} className="border-t border-steel-300">
              <td>{r.label}</td>
              <td className="font-mono font-bold">{r.actual}</td>
              <td className="font-mono">{r.target}</td>
            </tr>
          ))}
        </tbody>
      </table>
      {figures.used.length > 0 && (
        <p className="mt-3 text-base">
          <strong>Worked from:</strong> {figures.used.map(figureUsedText).join("; ")}.
        </p>
      )}
      {[...figures.missing, ...figures.problems].length > 0 && (
        <ul className="mt-2 list-disc pl-6 text-base" data-testid="build-figures-missing">
          {[...figures.missing, ...figures.problems].map((m) => (
            <li key={m}>⚠ {m}</li>
          ))}
        </ul>
      )}
      <p className="mt-2 text-sm">
        Readings are found by their spec key (bore, stroke, chamber-volume, deck-clearance, gasket-thickness); the boosted figures are the
        trade&apos;s rule of thumb, ratio × absolute manifold pressure ÷ air pressure (common practice).
      </p>
    </section>
  );
}
