import "server-only";
import { buildFigureRows, figureUsedText } from "@/lib/build-figures/figure-rows";
import { boreGeometry, convertPower, convertTorque } from "@/lib/calc";
import { compareAtSameRpm, summariseRun } from "@/lib/dyno";
import { torquePassCount } from "@/lib/procedures/spec-counts";
import { openItemLine, openItemsSummary } from "@/lib/work-orders/open-items";
import { STATUS_LABELS } from "@/lib/work-orders/status";
import { dayIn } from "@/lib/aftercare/reminders";
import type { HandoverReportData } from "@/db/records/handover-report";

// What the build report prints, section by section, as rows of text: the PDF draws these rows, and
// a stored copy keeps them as lines (`reportLines`) so the next revision can say what changed.
// Every figure comes from the record's own definitions (db/records/handover-report.ts).

/** The day an instant fell on at the shop, as the shop's own clock read it (YYYY-MM-DD). */
export const shopDay = (timeZone: string, at: Date | string) => dayIn(timeZone, new Date(at));
const num = (v: string | number | null) => (v === null ? "" : String(Number(v)));
const VERDICT = { in: "in spec", low: "LOW, out of spec", high: "HIGH, out of spec" } as const;
const TO_WORDS = { ready: "Released for collection", handed_over: "Handed over" } as const;

export function bikeRows(d: HandoverReportData): string[][] {
  const j = d.job;
  return [
    ["Bike", `${j.make} ${j.model}${j.year ? ` (${j.year})` : ""}`],
    ["Tag", j.tagCode],
    [
      "Engine",
      `${j.displacementCc ? `${j.displacementCc} cc` : "—"}${j.engineNumber ? `, engine no. ${j.engineNumber}` : ""}${j.vin ? `, VIN ${j.vin}` : ""}`,
    ],
    ["Owner", j.customerName],
    ["Work order", `#${j.number}: ${j.title}`],
    ["Status", STATUS_LABELS[j.status]],
    ["Odometer at intake", j.odometerKm === null ? "—" : `${j.odometerKm} km`],
    ["Reason for the work", j.complaint || "—"],
    ["Lead mechanic", j.mechanicName ?? "—"],
  ];
}

/** The office's overrides, for page one: what moved on with items open, who, when, why, and those items. */
export function overrideBlocks(d: HandoverReportData) {
  return d.overrides.map((o) => ({
    title: `${TO_WORDS[o.to]} with open items: ${openItemsSummary(o.openItems)}`,
    who: `By ${o.byName} on ${shopDay(d.job.timeZone, o.at)}. Reason given: “${o.reason}”`,
    items: o.openItems.map(openItemLine),
  }));
}

export const procedureLine = (d: HandoverReportData, p: HandoverReportData["procedures"][number]) => {
  const steps = d.steps.filter((s) => s.versionId === p.versionId);
  return `${p.name} (template version ${p.version}): ${steps.filter((s) => s.done).length} of ${steps.length} steps completed`;
};

/** Each procedure's steps, stage by stage: done (when, by whom), sent back and not redone, or not done. */
export function workDoneRows(d: HandoverReportData, versionId: string): string[][] {
  const steps = d.steps.filter((s) => s.versionId === versionId);
  const stages = [...new Map(steps.map((s) => [s.stageKey, s.stageTitle])).entries()];
  return stages.flatMap(([key, title]) =>
    steps
      .filter((s) => s.stageKey === key)
      .map((s, i) => [
        i === 0 ? title : "",
        s.title,
        s.done && s.doneAt
          ? `${shopDay(d.job.timeZone, s.doneAt)}, ${s.doneBy}`
          : s.reopenedReason
            ? `sent back, not redone: ${s.reopenedReason}`
            : "not done",
      ]),
  );
}

// Bench records name the mechanic who fitted the part; office records name who wrote them down.
function fittedWhereBy(p: HandoverReportData["parts"][number]): string {
  const at = p.stepTitle ?? "no step named";
  const who = !p.fittedByName ? at : p.atBench ? `${at}, ${p.fittedByName}` : `${at}, recorded by ${p.fittedByName}`;
  return who + (p.flagReason ? ` (flagged: ${p.flagReason})` : "");
}

export const partRows = (d: HandoverReportData): string[][] =>
  d.parts.map((p) => [p.partNumber, p.description, p.supplier, p.serial ?? "—", p.batch ?? "—", String(p.quantity), fittedWhereBy(p)]);

/** One row per current reading (the database view current_measurements): which, value, spec, verdict. */
export const readingRows = (d: HandoverReportData): string[][] =>
  d.readings.map((r) => {
    const which = r.readingLabels[r.readingIndex] ?? (r.readingLabels.length ? `reading ${r.readingIndex + 1}` : "");
    const settled = r.verdict === "in" ? "" : r.acceptedBecause ? `; let stand: ${r.acceptedBecause}` : "; not let stand";
    return [
      which ? `${r.label}, ${which}` : r.label,
      // as typed and stored: numeric keeps the scale ("0.030" stays "0.030")
      `${r.value} ${r.unit}`,
      `${num(r.min)} to ${num(r.max)} ${r.specUnit}${r.nominal === null ? "" : ` (nominal ${num(r.nominal)})`}`,
      VERDICT[r.verdict] + settled + (r.flagReason ? ` (flagged: ${r.flagReason})` : ""),
    ];
  });

export function readingsSummary(d: HandoverReportData): string {
  const out = d.readings.filter((r) => r.verdict !== "in").length;
  return out === 0
    ? `All ${d.readings.length} current readings are within spec.`
    : `${out} of ${d.readings.length} current readings are out of spec (marked above).`;
}

/** Taper and out-of-round of each bore spec whose six bore-gauge readings are all on record. */
export function boreLines(d: HandoverReportData): string[] {
  const out: string[] = [];
  for (const specId of new Set(d.readings.filter((r) => r.geometry === "bore").map((r) => r.specId))) {
    const rs = d.readings.filter((r) => r.specId === specId);
    const get = (depth: string, axis: string) =>
      rs.find((r) => (r.readingLabels[r.readingIndex] ?? "").toLowerCase() === `${depth} ${axis}`);
    const cells = ["top", "middle", "bottom"].flatMap((depth) => [get(depth, "thrust"), get(depth, "pin")]);
    if (cells.some((c) => !c)) continue;
    const v = (depth: string, axis: string) => Number(get(depth, axis)!.value);
    const g = boreGeometry({
      top: { thrust: v("top", "thrust"), pin: v("top", "pin") },
      middle: { thrust: v("middle", "thrust"), pin: v("middle", "pin") },
      bottom: { thrust: v("bottom", "thrust"), pin: v("bottom", "pin") },
    });
    const unit = rs[0].unit;
    out.push(
      `${rs[0].label}: taper ${g.taper.max.toFixed(4)} ${unit}, out-of-round ${g.outOfRound.max.toFixed(4)} ${unit} (largest of the six readings ${g.largest} ${unit}).`,
    );
  }
  return out;
}

export function torqueRows(d: HandoverReportData): string[][] {
  return d.torqueSpecs
    .filter((t) => Number(t.recorded) > 0)
    .map((t) => {
      const passes = t.passes.map((p) => ("percent" in p ? `${p.percent} %` : `${p.value} ${t.unit}`));
      const angles = t.anglePasses.map((a) => `+${a}°`);
      const expected =
        torquePassCount({ finalValue: Number(t.finalValue), unit: t.unit, passes: t.passes, anglePasses: t.anglePasses }) * t.boltCount;
      const value = Number(t.finalValue);
      const other = t.unit === "N·m" ? `${convertTorque(value, "N·m", "lbf·ft").toFixed(1)} lbf·ft` : "";
      return [
        t.label,
        `${num(t.finalValue)} ${t.unit}${other ? ` (${other})` : ""}`,
        [...passes, ...angles].join(", ") + `; ${t.pattern}`,
        `${t.recorded} of ${expected}`,
        [t.torqueToYield ? "stretch bolts, new fitted" : "", t.lubricant].filter(Boolean).join("; "),
      ];
    });
}

export function signOffRows(d: HandoverReportData): string[][] {
  const stageTitle = (key: string) => d.steps.find((s) => s.stageKey === key)?.stageTitle ?? key;
  return d.signOffs.map((s) => {
    const ds = d.decisions.filter((x) => x.signOffId === s.id);
    const review = ds.length
      ? ds
          .map(
            (x) =>
              `${x.decision === "approved" ? "Approved" : "Sent back"} by ${x.decidedBy}, ${shopDay(d.job.timeZone, x.decidedAt)}${x.reason ? `: ${x.reason}` : ""}`,
          )
          .join("; ")
      : "waiting for review";
    return [stageTitle(s.stageKey), `${s.signedBy}, ${shopDay(d.job.timeZone, s.signedAt)}`, review];
  });
}

/** Entries the sync kept and flagged, and whether the supervisor accepted each (with the reason written). */
export const flaggedRows = (d: HandoverReportData): string[][] =>
  d.flagged.map((f) => [
    [f.what, f.stepTitle ? `at ${f.stepTitle}` : ""].filter(Boolean).join(", ") + `, by ${f.by}`,
    f.flagReason,
    f.acceptance
      ? f.acceptance.onItsOwn
        ? `Accepted by ${f.acceptance.by} on its own, with no sign-off to review: ${f.acceptance.justification}`
        : `Accepted by ${f.acceptance.by}: ${f.acceptance.justification}`
      : "not accepted yet",
  ]);

/** What is open on the record now (lib/work-orders/open-items.ts), one line each. */
export const openItemLines = (d: HandoverReportData): string[] => d.openItems.map(openItemLine);

/** Every counting run recomputed from its raw torque to one standard, the latest run's, so they compare alike. */
export function runsOf(d: HandoverReportData) {
  const standard = d.runs.at(-1)?.standard;
  return d.runs.map((r) => summariseRun(r, standard));
}

export function dynoRows(runs: ReturnType<typeof runsOf>): string[][] {
  return runs.map((r) => {
    const pk = r.curve.peaks;
    return [
      `${r.label}\n${r.ranOn}, ${r.boostTarget} ${r.boostUnit} target`,
      `${r.pressureKpa} kPa, ${r.temperatureC} °C, ${r.humidityPercent} % RH\n${r.standardLabel}, factor ${r.curve.factor.toFixed(4)}`,
      `${pk.correctedPowerKw.value.toFixed(1)} kW\n${convertPower(pk.correctedPowerKw.value, "kW", "hp").toFixed(1)} hp\nat ${pk.correctedPowerKw.rpm} rpm`,
      `${pk.correctedTorqueNm.value.toFixed(1)} N·m\n${convertTorque(pk.correctedTorqueNm.value, "N·m", "lbf·ft").toFixed(1)} lbf·ft\nat ${pk.correctedTorqueNm.rpm} rpm`,
      r.tune ? r.tune.label : "none named",
    ];
  });
}

/** The first and last counting runs compared, or null with fewer than two. */
export function dynoComparison(runs: ReturnType<typeof runsOf>): string | null {
  if (runs.length < 2) return null;
  const a = runs[0];
  const b = runs[runs.length - 1];
  const c = compareAtSameRpm(a, b);
  const sign = (n: number) => `${n >= 0 ? "+" : "−"}${Math.abs(n).toFixed(1)}`;
  return (
    `${b.label} against ${a.label}: peak power ${sign(c.peakDelta.powerKw)} kW (${sign(c.peakDelta.powerPercent)} %), peak torque ${sign(c.peakDelta.torqueNm)} N·m (${sign(c.peakDelta.torquePercent)} %)` +
    (c.largestGain ? `; largest gain at the same engine speed ${sign(c.largestGain.value)} kW at ${c.largestGain.rpm} rpm` : "") +
    `; boost target ${sign(c.deltaBoostTargetKpa)} kPa.`
  );
}

/** Entries taken back at the bench: they stay on the record, listed with who, when and why, and count nowhere above. */
export const withdrawnRows = (d: HandoverReportData): string[][] =>
  d.withdrawn.map((w) => [
    w.what,
    `${w.recordedBy}, ${shopDay(d.job.timeZone, w.recordedAt)}`,
    `${w.withdrawnBy}, ${shopDay(d.job.timeZone, w.withdrawnAt)}`,
    w.reason,
  ]);

/**
 * Everything the report prints about the job's record, one line per row or sentence, prefixed
 * with its section (the run-in advice and the general cautions, the same in every report, left
 * out). Stored with each copy; two copies' lines compared say what changed.
 */
export function reportLines(d: HandoverReportData): string[] {
  const rows = (section: string, list: string[][]) => list.map((r) => `${section}: ${r.filter(Boolean).join(" · ").replace(/\n/g, ", ")}`);
  const runs = runsOf(d);
  return [
    ...rows("The bike", bikeRows(d)),
    ...overrideBlocks(d).flatMap((b) => [`Overrides: ${b.title}. ${b.who}`, ...b.items.map((i) => `Overrides: open then: ${i}`)]),
    ...d.procedures.flatMap((p) => [`Work done: ${procedureLine(d, p)}`, ...rows(`Work done › ${p.name}`, workDoneRows(d, p.versionId))]),
    ...rows("Parts fitted", partRows(d)),
    ...rows("Measurements", readingRows(d)),
    ...(d.readings.length ? [`Measurements: ${readingsSummary(d)}`] : []),
    ...boreLines(d).map((l) => `Measurements: ${l}`),
    ...rows("Build figures", buildFigureReportRows(d)),
    ...buildFigureNotes(d).map((l) => `Build figures: ${l}`),
    ...rows("Torque applied", torqueRows(d)),
    ...rows("Sign-offs and reviews", signOffRows(d)),
    ...rows("Withdrawn entries", withdrawnRows(d)),
    ...rows("Flagged entries", flaggedRows(d)),
    ...openItemLines(d).map((l) => `Still open: ${l}`),
    ...rows("Dyno results", dynoRows(runs)),
    ...runs.filter((r) => r.notes).map((r) => `Dyno results: ${r.label}: ${r.notes}`),
    ...(dynoComparison(runs) ? [`Dyno results: ${dynoComparison(runs)}`] : []),
    ...d.tunes.map((t) => `Tune: ${t.label} · ${t.fileName} · SHA-256 ${t.sha256}`),
  ];
}

/** The build's own figures beside the targets (lib/build-figures/figure-rows.ts, the rows every screen shows). */
export function buildFigureReportRows(d: HandoverReportData): string[][] {
  return buildFigureRows(d.buildFigures)
    .filter((r) => r.actual !== "—" || r.target !== "—")
    .map((r) => [r.label, r.actual, r.target === "—" ? "" : `target ${r.target}`]);
}

/** What the build figures were worked from, and what is missing for the rest. */
export function buildFigureNotes(d: HandoverReportData): string[] {
  const f = d.buildFigures;
  const used = f.used.length ? [`worked from ${f.used.map(figureUsedText).join("; ")}`] : [];
  return [...used, ...f.missing, ...f.problems];
}
