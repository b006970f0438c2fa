import { pairByKey, readingPlace, type PairedRow } from "@/lib/aftercare/side-by-side";
import { summariseRun } from "@/lib/dyno/run-summary";
import type { ComeBackView } from "@/db/aftercare/come-backs";

// The original job's record beside the come-back's, section by section (server-rendered).

type Report = ComeBackView["original"];

function Cells<T>({
  rows,
  show,
  testId,
  none = "Nothing recorded on either job.",
}: {
  rows: PairedRow<T>[];
  show: (t: T) => React.ReactNode;
  testId: string;
  none?: string;
}) {
  if (!rows.length) return <p className="text-lg">{none}</p>;
  return (
    <table className="w-full table-fixed border-collapse text-left text-lg" data-testid={testId}>
      <thead>
        <tr className="border-b-2 border-steel-700">
          <th className="w-1/3 py-2 pr-4">What</th>
          <th className="w-1/3 py-2 pr-4">At handover</th>
          <th className="w-1/3 py-2 pr-4">Found now</th>
        </tr>
      </thead>
      <tbody>
        {rows.map((r) => (
          <tr key={r.key} className="border-b border-steel-300 align-top" data-testid={`${testId}-row`}>
            <th scope="row" className="py-2 pr-4 font-bold break-words">
              {r.key}
            </th>
            <td className="py-2 pr-4 break-words" data-testid="then">
              {r.then.length ? r.then.map((t, i) => <div key={i}>{show(t)}</div>) : <span className="text-steel-500">—</span>}
            </td>
            <td className="py-2 pr-4 break-words" data-testid="now">
              {r.now.length ? r.now.map((t, i) => <div key={i}>{show(t)}</div>) : <span className="text-steel-500">not yet recorded</span>}
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

const VERDICT_MARK: Record<string, string> = { in: "✔ in limits", low: "▼ below limits", high: "▲ above limits" };

export function SideBySide({ original, now }: { original: Report; now: Report }) {
  const readings = pairByKey(original.readings, now.readings, (r) => readingPlace({ ...r, readingLabels: r.readingLabels ?? [] }));
  const torque = pairByKey(original.torqueSpecs, now.torqueSpecs, (t) => t.label);
  const parts = pairByKey(original.parts, now.parts, (p) => `${p.partNumber} ${p.description}`);
  const tunes = pairByKey(original.tunes, now.tunes, () => "Tune versions");
  const runs = pairByKey(original.runs, now.runs, () => "Dyno runs");
  return (
    <div className="grid gap-8">
      <section aria-labelledby="sbs-readings">
        <h2 id="sbs-readings" className="mb-2 text-2xl font-bold">
          Readings
        </h2>
        <Cells
          rows={readings}
          testId="sbs-readings"
          show={(r) => (
            <span>
              <span className="font-mono">
                {r.value} {r.unit}
              </span>{" "}
              <span className={r.verdict === "in" ? "text-pass" : "font-bold text-fail"}>{VERDICT_MARK[r.verdict] ?? r.verdict}</span>{" "}
              <span className="text-base text-steel-700">
                (limits {r.min}–{r.max} {r.specUnit})
              </span>
            </span>
          )}
        />
      </section>
      <section aria-labelledby="sbs-torque">
        <h2 id="sbs-torque" className="mb-2 text-2xl font-bold">
          Torque
        </h2>
        <Cells
          rows={torque}
          testId="sbs-torque"
          show={(t) => (
            <span>
              <span className="font-mono">
                {t.finalValue} {t.unit}
              </span>
              , {t.boltCount} bolts · {Number(t.recorded ?? 0)} bolt passes recorded
              {t.lubricant ? ` · ${t.lubricant}` : ""}
            </span>
          )}
        />
      </section>
      <section aria-labelledby="sbs-parts">
        <h2 id="sbs-parts" className="mb-2 text-2xl font-bold">
          Parts fitted
        </h2>
        <Cells
          rows={parts}
          testId="sbs-parts"
          show={(p) => (
            <span>
              ×{p.quantity}
              {p.batch ? (
                <>
                  {" "}
                  · batch <span className="font-mono">{p.batch}</span>
                </>
              ) : null}
              {p.serial ? (
                <>
                  {" "}
                  · serial <span className="font-mono">{p.serial}</span>
                </>
              ) : null}
              {p.supplier ? ` · ${p.supplier}` : ""}
            </span>
          )}
        />
      </section>
      <section aria-labelledby="sbs-tune">
        <h2 id="sbs-tune" className="mb-2 text-2xl font-bold">
          Tune and dyno
        </h2>
        <Cells
          rows={tunes}
          testId="sbs-tunes"
          none="No tune file on either job."
          show={(t) => (
            <span>
              <span className="font-bold">{t.label}</span> · {t.fileName} · <span className="font-mono">{t.sha256.slice(0, 12)}</span>
            </span>
          )}
        />
        <div className="mt-4">
          <Cells
            rows={runs}
            testId="sbs-runs"
            none="No dyno run on either job."
            show={(run) => {
              const s = summariseRun(run);
              const p = s.curve.peaks.correctedPowerKw;
              const tq = s.curve.peaks.correctedTorqueNm;
              return (
                <span>
                  <span className="font-bold">{run.label}</span> ({run.ranOn.slice(0, 10)}): peak {p.value.toFixed(1)} kW at {p.rpm} rpm,{" "}
                  {tq.value.toFixed(1)} N·m at {tq.rpm} rpm, {s.standardLabel}
                </span>
              );
            }}
          />
        </div>
      </section>
    </div>
  );
}
