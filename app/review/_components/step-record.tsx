import { formatDayTime } from "@/lib/format/dates";
import type { ReadingLine, SpecView, StepReview, TorqueView, WithdrawnLine } from "./review-types";
import { VerdictTag, When } from "./when";

/** An entry taken back: it stays on the record, struck through, with who, when and why. */
export function Withdrawn({ w }: { w: WithdrawnLine }) {
  return (
    <span className="block rounded border-2 border-fail bg-fail-light px-2 py-1 text-sm font-bold text-fail" data-testid="withdrawn-mark">
      ⊘ Withdrawn by {w.by.name}, {formatDayTime(w.at)}: “{w.reason}” — it no longer counts
    </span>
  );
}

// One step of the signed-off stage as the supervisor reads it: who did it and when, every reading
// (replaced ones too), two tablets' readings of one spot side by side, torque bolt by bolt, timers, photos, parts.
export function StepRecord({ step }: { step: StepReview }) {
  return (
    <section
      className="rounded-xl border-2 border-steel-300 bg-white p-4"
      aria-label={`Step ${step.number}: ${step.title}`}
      data-testid="review-step"
    >
      <h3 className="text-xl font-bold">
        Step {step.number} · {step.title}
      </h3>
      {step.sentBack.length > 0 && (
        <p className="mt-1 text-base font-bold text-warn">
          ↺ Sent back {step.sentBack.length === 1 ? "once" : `${step.sentBack.length} times`} — latest: “{step.sentBack[0].reason}” (
          {step.sentBack[0].by.name}, {formatDayTime(step.sentBack[0].decidedAt)})
        </p>
      )}
      <div className="mt-2">
        {step.completions.length === 0 ? (
          <p className="font-bold text-fail">✖ Not marked done</p>
        ) : (
          <ul className="space-y-1">
            {step.completions.map((c, i) => (
              <li key={c.id} className="flex flex-wrap items-baseline gap-x-3">
                <span className={`font-bold ${c.withdrawn ? "line-through" : ""}`}>
                  ✔ {i === 0 ? "Done" : "Done again"} by {c.by.name}
                </span>
                <When device={c.deviceTime} received={c.receivedAt} />
                {c.deviceId && <span className="font-mono text-sm text-steel-700">tablet {c.deviceId}</span>}
                {c.flagReason && <span className="w-full text-sm font-bold text-warn">⚑ {c.flagReason}</span>}
                {c.withdrawn && <Withdrawn w={c.withdrawn} />}
              </li>
            ))}
          </ul>
        )}
      </div>
      {step.specs.map((spec) => (
        <SpecReadings key={spec.id} spec={spec} />
      ))}
      {step.torque.map((t) => (
        <TorqueGrid key={t.id} t={t} />
      ))}
      {step.timers.length > 0 && (
        <div className="mt-3">
          <h4 className="font-bold">Timers</h4>
          <ul>
            {step.timers.map((t) => (
              <li key={t.id}>
                {t.label}: {Math.round(t.durationS / 60)} min, started {formatDayTime(t.startedAt)} by {t.startedBy.name}
                {t.stoppedAt ? `, stopped ${formatDayTime(t.stoppedAt)}` : ""}
                {t.stop && (t.stop.by || t.stop.reason) && (
                  <span className="block">
                    Stopped{t.stop.by ? ` by ${t.stop.by.name}` : ""}
                    {t.stop.reason ? `: “${t.stop.reason}”` : ""}
                  </span>
                )}
                {t.cancelled && (
                  <span className="block font-bold text-fail">
                    ⊘ Cancelled{t.cancelled.by ? ` by ${t.cancelled.by.name}` : ""}, {formatDayTime(t.cancelled.at)}: “{t.cancelled.reason}”
                    — it does not count
                  </span>
                )}
                {t.override && (
                  <span className="block font-bold text-warn">
                    ⚑ Cut short by {t.override.by.name}: {t.override.reason}
                  </span>
                )}
              </li>
            ))}
          </ul>
        </div>
      )}
      {step.photos.length > 0 && (
        <div className="mt-3">
          <h4 className="font-bold">Photos</h4>
          <ul className="mt-1 flex flex-wrap gap-3">
            {step.photos.map((p) => (
              <li key={p.id} className="w-36 text-sm">
                {p.awaitingUpload ? (
                  <span className="flex h-24 items-center justify-center rounded-lg border-2 border-dashed border-steel-500 p-2 text-center">
                    Still on the tablet
                  </span>
                ) : (
                  // eslint-disable-next-line @next/next/no-img-element
                  <img
                    src={`/api/office/attachments/${p.id}`}
                    alt={p.caption || "Step photo"}
                    className="h-24 w-36 rounded-lg border-2 border-steel-700 object-cover"
                  />
                )}
                <span className="block">
                  {p.contentType.replace("image/", "").toUpperCase()}, {Math.max(1, Math.round(p.byteSize / 1024))} kB ·{" "}
                  {formatDayTime(p.createdAt)}
                </span>
                {p.caption && <span className="block">{p.caption}</span>}
                {p.withdrawn && <Withdrawn w={p.withdrawn} />}
              </li>
            ))}
          </ul>
        </div>
      )}
      {step.parts.length > 0 && (
        <div className="mt-3">
          <h4 className="font-bold">Parts fitted</h4>
          <ul className="mt-1 space-y-1">
            {step.parts.map((p) => (
              <li key={p.id} data-testid="review-part">
                {p.quantity} × <span className="font-mono">{p.partNumber}</span> {p.description}
                {p.serial && <span className="font-mono"> · serial {p.serial}</span>}
                {p.batch && <span className="font-mono"> · batch {p.batch}</span>} · {p.by ? p.by.name : "recorded in the office"} ·{" "}
                {formatDayTime(p.fittedAt)}
                {p.flagReason && <span className="block font-bold text-warn">⚑ {p.flagReason}</span>}
                {p.withdrawn && <Withdrawn w={p.withdrawn} />}
              </li>
            ))}
          </ul>
        </div>
      )}
    </section>
  );
}

function limits(spec: SpecView) {
  return `${spec.nominal !== null ? `nominal ${spec.nominal} · ` : ""}${spec.min} to ${spec.max} ${spec.unit}`;
}

function SpecReadings({ spec }: { spec: SpecView }) {
  return (
    <div className="mt-3">
      <h4 className="font-bold">
        {spec.label} <span className="font-mono font-normal">({limits(spec)})</span>
      </h4>
      <div className="overflow-x-auto">
        <table className="mt-1 w-full border-collapse text-left text-base">
          <thead>
            <tr className="border-b-2 border-steel-700">
              <th className="py-1 pr-3">Where</th>
              <th className="py-1 pr-3">Reading</th>
              <th className="py-1 pr-3">Verdict</th>
              <th className="py-1 pr-3">Who and when</th>
              <th className="py-1 pr-3">Standing</th>
            </tr>
          </thead>
          <tbody>
            {spec.spots.map((spot) =>
              spot.history.length === 0 ? (
                <tr key={spot.readingIndex} className="border-b border-steel-300">
                  <td className="py-1 pr-3 font-bold">{spot.label}</td>
                  <td colSpan={4} className="py-1 font-bold text-fail">
                    ✖ not read
                  </td>
                </tr>
              ) : (
                spot.history.map((r, i) => <ReadingRow key={r.id} label={i === 0 ? spot.label : ""} r={r} />)
              ),
            )}
          </tbody>
        </table>
      </div>
      {spec.spots
        .filter((s) => s.rivals.length > 1)
        .map((spot) => (
          <div key={spot.readingIndex} className="mt-2 rounded-lg border-4 border-warn bg-warn-light p-3" data-testid="rival-readings">
            <p className="font-bold text-warn">
              ⚑ {spot.label}: read on {spot.rivals.length} tablets and neither replaced the other
            </p>
            <div className="mt-2 grid gap-3 md:grid-cols-2">
              {spot.rivals.map((r) => (
                <div key={r.id} className="rounded-lg border-2 border-steel-700 bg-white p-2">
                  <p className="font-mono text-xl">
                    {r.value} {r.unit} <VerdictTag verdict={r.verdict} />
                  </p>
                  <p className="text-sm">
                    {r.by.name} · tablet <span className="font-mono">{r.deviceId}</span>
                  </p>
                  <When device={r.deviceTime} received={r.receivedAt} />
                  <p className="font-bold">{r.current ? "✔ Counts (latest stamp)" : "Does not count (earlier stamp)"}</p>
                </div>
              ))}
            </div>
          </div>
        ))}
    </div>
  );
}

function ReadingRow({ label, r }: { label: string; r: ReadingLine }) {
  return (
    <tr className={`border-b border-steel-300 align-top ${r.current ? "" : "text-steel-700"}`} data-testid="reading-row">
      <td className="py-1 pr-3 font-bold">{label}</td>
      <td className={`py-1 pr-3 font-mono ${r.supersededBy ? "line-through" : ""}`}>
        {r.value} {r.unit}
        {r.note && <span className="block whitespace-normal font-sans text-sm no-underline">“{r.note}”</span>}
      </td>
      <td className="py-1 pr-3">
        <VerdictTag verdict={r.verdict} />
      </td>
      <td className="py-1 pr-3">
        <span className="text-sm font-bold">{r.by.name}</span> <span className="font-mono text-sm">({r.deviceId})</span>
        <br />
        <When device={r.deviceTime} received={r.receivedAt} />
      </td>
      <td className="py-1 pr-3 text-sm">
        {r.current ? (
          <span className="font-bold">✔ current</span>
        ) : r.supersededBy ? (
          "replaced by a correction"
        ) : (
          "earlier stamp, not current"
        )}
        {r.acceptance && (
          <span className="mt-1 block rounded border-2 border-pass bg-pass-light p-1 font-bold text-pass">
            Let stand by {r.acceptance.by.name}: “{r.acceptance.justification}”
          </span>
        )}
        {r.flagReason && <span className="block font-bold text-warn">⚑ {r.flagReason}</span>}
      </td>
    </tr>
  );
}

function boltState(b: TorqueView["passes"][number]["bolts"][number]) {
  const counting = b.records.filter((r) => !r.withdrawn);
  if (counting.length > 1) return { mark: "2×", cls: "border-warn bg-warn-light text-warn", what: `recorded ${counting.length} times` };
  if (b.done)
    return { mark: "✔", cls: "border-pass bg-pass-light text-pass", what: `done by ${b.done.by.name} ${formatDayTime(b.done.deviceTime)}` };
  if (b.records.length) return { mark: "⊘", cls: "border-fail text-fail", what: "withdrawn, to do again" };
  return { mark: "✖", cls: "border-fail text-fail", what: "not done" };
}

function TorqueGrid({ t }: { t: TorqueView }) {
  const all = t.passes.flatMap((p) => p.bolts.flatMap((b) => b.records.map((r) => ({ r, pass: p.index, bolt: b.bolt }))));
  const counting = all.filter((x) => !x.r.withdrawn);
  const withdrawn = all.filter((x) => x.r.withdrawn);
  return (
    <div className="mt-3" data-testid="review-torque">
      <h4 className="font-bold">
        {t.label}: {t.finalValue} {t.unit}, {t.boltCount} bolts, {t.pattern} order{t.torqueToYield ? ", stretch bolts" : ""} —{" "}
        {t.complete ? <span className="text-pass">✔ every pass done</span> : <span className="text-fail">✖ passes missing</span>}
      </h4>
      {t.repeated.length > 0 && (
        <div
          className={`mt-1 rounded-lg border-4 p-2 font-bold ${t.torqueToYield ? "border-fail bg-fail-light text-fail" : "border-warn bg-warn-light text-warn"}`}
          data-testid="bolts-twice"
        >
          ⚑ {t.torqueToYield ? "Stretch bolts recorded twice" : "Bolts recorded twice"}:{" "}
          {t.repeated
            .map(
              (r) =>
                `bolt ${r.bolt} pass ${r.passIndex} (${r.records.map((x) => `${x.by.name}, tablet ${x.deviceId ?? "?"}`).join(" and ")})`,
            )
            .join("; ")}
        </div>
      )}
      <div className="overflow-x-auto">
        <table className="mt-1 border-collapse text-sm">
          <thead>
            <tr>
              <th className="pr-3 text-left">Pass</th>
              {t.passes[0]?.bolts.map((b) => (
                <th key={b.bolt} className="px-1">
                  {b.bolt}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {t.passes.map((p) => (
              <tr key={p.index}>
                <td className="pr-3">
                  {p.index}: {p.label}
                </td>
                {p.bolts.map((b) => {
                  const st = boltState(b);
                  return (
                    <td key={b.bolt} className="px-1 text-center">
                      <span
                        className={`inline-flex h-8 w-8 items-center justify-center rounded border-2 font-bold ${st.cls}`}
                        aria-label={`pass ${p.index} bolt ${b.bolt} ${st.what}`}
                      >
                        {st.mark}
                      </span>
                    </td>
                  );
                })}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {counting.length > 0 &&
        (() => {
          const by = [...new Set(counting.map((d) => d.r.by.name))].join(", ");
          const times = counting.map((d) => Date.parse(d.r.deviceTime));
          const wrench = counting.filter((d) => d.r.wrench).map((d) => d.r.wrench);
          return (
            <p className="text-sm">
              By {by}, {formatDayTime(new Date(Math.min(...times)).toISOString())} to{" "}
              {formatDayTime(new Date(Math.max(...times)).toISOString())} on the tablet
              {wrench.length ? ` · wrench readings: ${wrench.join(", ")}` : ""}
            </p>
          );
        })()}
      {withdrawn.length > 0 && (
        <ul className="mt-1 space-y-1" aria-label="Withdrawn bolts">
          {withdrawn.map(({ r, pass, bolt }) => (
            <li key={r.id} data-testid="withdrawn-bolt">
              <span className="line-through">
                Bolt {bolt}, pass {pass} by {r.by.name}, {formatDayTime(r.deviceTime)}
              </span>{" "}
              <Withdrawn w={r.withdrawn!} />
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
