import "server-only";
import { boreGeometry, convertPower, convertTorque } from "@/lib/calc";
import { torquePassCount } from "@/lib/procedures/spec-counts";
import { compareAtSameRpm, summariseRun } from "@/lib/dyno";
import { STATUS_LABELS } from "@/lib/work-orders/status";
import { loadHandoverReport, type HandoverReportData } from "@/db/records/handover-report";
import { listTuneVersions } from "@/db/records/tunes";
import { drawCurvePlot } from "./report/curve-plot";
import { tuneSection } from "./report/tune-section";
import { FONT, footers, heading, newPdf, paragraph, pdfText, table, toBuffer, type Pdf } from "./report/pdf-layout";
import type { Db } from "@/db/setup/client";

// The handover build report: a PDF for the customer and the shop's records, made on the server
// from the database (no browser). Exported for the "bike ready" e-mail as well as the download.

export class ReportNotFoundError extends Error {
  constructor() {
    super("No such work order in this shop.");
  }
}

const day = (d: Date | string) => new Date(d).toISOString().slice(0, 10);
const num = (v: string | number | null) => (v === null ? "" : String(Number(v)));
const VERDICT = { in: "in spec", low: "LOW, out of spec", high: "HIGH, out of spec" } as const;

const RUN_IN_ADVICE = [
  "First 300 km: keep below half the rev range and off boost; vary engine speed, no long steady cruising, no full-throttle pulls.",
  "300 to 800 km: build up gradually to three quarters of the rev range; short, light use of boost only once the engine is fully warm.",
  "Change the engine oil and filter at 800 km (or sooner if the maker's data says so); we check the plugs and look for leaks at the same visit.",
  "Always let the engine reach working temperature before using boost, and let the turbo idle for a minute before switching off after hard riding.",
  "Use the fuel grade the tune was made on; a lower grade can cause detonation under boost.",
];

const CAUTIONS = [
  "The figures, limits and advice in this report are the workshop's record of this build. The engine maker's service data, the parts makers' instructions and local rules come first wherever they differ.",
  "Dyno figures depend on the dyno, the air and the correction standard named beside them; compare runs only against figures made the same way.",
  "Any warning light, knocking, smoke, oil or coolant loss, or a change in boost behaviour: stop riding and contact the workshop.",
];

function theBike(doc: Pdf, d: HandoverReportData) {
  const j = d.job;
  table(
    doc,
    [
      { header: "", width: 0.28 },
      { header: "", width: 0.72 },
    ],
    [
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
    ],
  );
}

function workDone(doc: Pdf, d: HandoverReportData) {
  const doneIds = new Set(d.completed.map((c) => c.stepId));
  if (d.procedures.length === 0) paragraph(doc, "No procedures were run on this work order.");
  for (const p of d.procedures) {
    const steps = d.steps.filter((s) => s.versionId === p.versionId);
    const done = steps.filter((s) => doneIds.has(s.id)).length;
    paragraph(doc, `${p.name} (template version ${p.version}): ${done} of ${steps.length} steps completed`, { bold: true });
    if (p.exampleOnly) paragraph(doc, "This procedure's figures were example figures; see the cautions at the end.", { size: 8.5 });
    const stages = [...new Map(steps.map((s) => [s.stageKey, s.stageTitle])).entries()];
    table(
      doc,
      [
        { header: "Stage", width: 0.28 },
        { header: "Step", width: 0.47 },
        { header: "Done", width: 0.25 },
      ],
      stages.flatMap(([key, title]) =>
        steps
          .filter((s) => s.stageKey === key)
          .map((s, i) => {
            const c = d.completed.find((x) => x.stepId === s.id);
            return [i === 0 ? title : "", s.title, c ? `${day(c.at)}, ${c.by}` : "not done"];
          }),
      ),
    );
    doc.moveDown(0.5);
  }
}

// Bench records name the mechanic who fitted the part; office records name who wrote them down.
function fittedWhereBy(p: HandoverReportData["parts"][number]): string {
  const at = p.stepTitle ?? "no step named";
  if (!p.fittedByName) return at;
  return p.atBench ? `${at}, ${p.fittedByName}` : `${at}, recorded by ${p.fittedByName}`;
}

function partsFitted(doc: Pdf, d: HandoverReportData) {
  if (d.parts.length === 0) return paragraph(doc, "No parts recorded.");
  table(
    doc,
    [
      { header: "Part no.", width: 0.13, figures: true },
      { header: "Description", width: 0.22 },
      { header: "Supplier", width: 0.13 },
      { header: "Serial", width: 0.12, figures: true },
      { header: "Batch", width: 0.11, figures: true },
      { header: "Qty", width: 0.06, align: "right" },
      { header: "Fitted at, by", width: 0.23 },
    ],
    d.parts.map((p) => [p.partNumber, p.description, p.supplier, p.serial ?? "—", p.batch ?? "—", String(p.quantity), fittedWhereBy(p)]),
  );
}

function measurements(doc: Pdf, d: HandoverReportData) {
  if (d.readings.length === 0) return paragraph(doc, "No readings recorded.");
  table(
    doc,
    [
      { header: "Reading", width: 0.36 },
      { header: "Value", width: 0.16, figures: true, align: "right" },
      { header: "Spec (min to max)", width: 0.26, figures: true },
      { header: "Verdict", width: 0.22 },
    ],
    d.readings.map((r) => {
      const which = r.readingLabels[r.readingIndex] ?? (r.readingLabels.length ? `reading ${r.readingIndex + 1}` : "");
      return [
        which ? `${r.label}, ${which}` : r.label,
        // as typed and stored: numeric keeps the scale ("0.030" stays "0.030")
        `${r.value} ${r.unit}`,
        `${num(r.min)} to ${num(r.max)} ${r.specUnit}${r.nominal === null ? "" : ` (nominal ${num(r.nominal)})`}`,
        VERDICT[r.verdict],
      ];
    }),
  );
  const out = d.readings.filter((r) => r.verdict !== "in").length;
  paragraph(
    doc,
    out === 0
      ? `All ${d.readings.length} current readings are within spec.`
      : `${out} of ${d.readings.length} current readings are out of spec (marked above).`,
    { bold: true },
  );

  // bore geometry from the six bore-gauge readings of each bore spec
  const bores = [...new Set(d.readings.filter((r) => r.geometry === "bore").map((r) => r.specId))];
  for (const specId of bores) {
    const rs = d.readings.filter((r) => r.specId === specId);
    const byLabel = (l: string) => rs.find((r) => (r.readingLabels[r.readingIndex] ?? "").toLowerCase() === l);
    const get = (depth: string, axis: string) => byLabel(`${depth} ${axis}`);
    const cells = ["top", "middle", "bottom"].flatMap((depth) => [get(depth, "thrust"), get(depth, "pin")]);
    if (cells.some((c) => !c)) continue;
    const v = (depth: string, axis: string) => Number(get(depth, axis)!.value);
    const g = boreGeometry({
      top: { thrust: v("top", "thrust"), pin: v("top", "pin") },
      middle: { thrust: v("middle", "thrust"), pin: v("middle", "pin") },
      bottom: { thrust: v("bottom", "thrust"), pin: v("bottom", "pin") },
    });
    paragraph(
      doc,
      `${rs[0].label}: taper ${g.taper.max.toFixed(4)} ${rs[0].unit}, out-of-round ${g.outOfRound.max.toFixed(4)} ${rs[0].unit} (largest of the six readings ${g.largest} ${rs[0].unit}).`,
    );
  }
}

function torqueApplied(doc: Pdf, d: HandoverReportData) {
  const applied = d.torqueSpecs.filter((t) => Number(t.recorded) > 0);
  if (applied.length === 0) return paragraph(doc, "No torque work recorded yet.");
  table(
    doc,
    [
      { header: "Fastening", width: 0.26 },
      { header: "Final value", width: 0.17, figures: true },
      { header: "Passes", width: 0.23 },
      { header: "Bolts × passes recorded", width: 0.18 },
      { header: "Notes", width: 0.16 },
    ],
    applied.map((t) => {
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
    }),
  );
}

// Entries taken back at the bench stay on the record: listed here with who, when and why, and left out of everything above.
function withdrawnEntries(doc: Pdf, d: HandoverReportData) {
  if (d.withdrawn.length === 0) return paragraph(doc, "Nothing was withdrawn.");
  table(
    doc,
    [
      { header: "Entry", width: 0.36 },
      { header: "Recorded", width: 0.2 },
      { header: "Withdrawn", width: 0.2 },
      { header: "Why", width: 0.24 },
    ],
    d.withdrawn.map((w) => [w.what, `${w.recordedBy}, ${day(w.recordedAt)}`, `${w.withdrawnBy}, ${day(w.withdrawnAt)}`, w.reason]),
  );
}

function signOffs(doc: Pdf, d: HandoverReportData) {
  if (d.signOffs.length === 0) return paragraph(doc, "No stage signed off yet.");
  const stageTitle = (key: string) => d.steps.find((s) => s.stageKey === key)?.stageTitle ?? key;
  table(
    doc,
    [
      { header: "Stage", width: 0.26 },
      { header: "Signed off", width: 0.25 },
      { header: "Review", width: 0.49 },
    ],
    d.signOffs.map((s) => {
      const ds = d.decisions.filter((x) => x.signOffId === s.id);
      const review = ds.length
        ? ds
            .map(
              (x) =>
                `${x.decision === "approved" ? "Approved" : "Sent back"} by ${x.decidedBy}, ${day(x.decidedAt as unknown as Date)}${x.reason ? `: ${x.reason}` : ""}`,
            )
            .join("; ")
        : "waiting for review";
      return [stageTitle(s.stageKey), `${s.signedBy}, ${day(s.signedAt)}`, review];
    }),
  );
}

function dynoResults(doc: Pdf, d: HandoverReportData) {
  if (d.runs.length === 0) return paragraph(doc, "No dyno runs recorded.");
  // Every run recomputed from its raw torque to one standard, the latest run's, so they compare alike.
  const standard = d.runs[d.runs.length - 1].standard;
  const runs = d.runs.map((r) => summariseRun(r, standard));
  paragraph(doc, `Corrected figures: every run recomputed to ${runs[0].standardLabel} from its recorded torque and air.`, { size: 9 });
  table(
    doc,
    [
      { header: "Run", width: 0.22 },
      { header: "Air, correction", width: 0.26 },
      { header: "Peak power", width: 0.18, figures: true },
      { header: "Peak torque", width: 0.18, figures: true },
      { header: "Tune", width: 0.16 },
    ],
    runs.map((r) => {
      const pk = r.curve.peaks;
      return [
        `${r.label}\n${r.ranOn}, ${r.boostTarget} ${r.boostUnit} target`,
        `${r.pressureKpa} kPa, ${r.temperatureC} °C, ${r.humidityPercent} % RH\n${r.standardLabel}, factor ${r.curve.factor.toFixed(4)}`,
        `${pk.correctedPowerKw.value.toFixed(1)} kW\n${convertPower(pk.correctedPowerKw.value, "kW", "hp").toFixed(1)} hp\nat ${pk.correctedPowerKw.rpm} rpm`,
        `${pk.correctedTorqueNm.value.toFixed(1)} N·m\n${convertTorque(pk.correctedTorqueNm.value, "N·m", "lbf·ft").toFixed(1)} lbf·ft\nat ${pk.correctedTorqueNm.rpm} rpm`,
        r.tune ? r.tune.label : "none named",
      ];
    }),
  );
  for (const r of runs) {
    if (r.validity && !r.validity.inside) {
      paragraph(doc, `${r.label}: outside the correction's validity range. ${r.validity.outside.map((o) => o.message).join(" ")}`, {
        size: 9,
      });
    }
  }
  for (const r of runs.filter((x) => x.notes)) paragraph(doc, `${r.label}: ${r.notes}`, { size: 9 });
  if (runs.length >= 2) {
    const a = runs[0];
    const b = runs[runs.length - 1];
    const c = compareAtSameRpm(a, b);
    const sign = (n: number) => `${n >= 0 ? "+" : "−"}${Math.abs(n).toFixed(1)}`;
    doc.moveDown(0.3);
    paragraph(
      doc,
      `${b.label} against ${a.label}: peak power ${sign(c.peakDelta.powerKw)} kW (${sign(c.peakDelta.powerPercent)} %), peak torque ${sign(c.peakDelta.torqueNm)} N·m (${sign(c.peakDelta.torquePercent)} %)` +
        (c.largestGain ? `; largest gain at the same engine speed ${sign(c.largestGain.value)} kW at ${c.largestGain.rpm} rpm` : "") +
        `; boost target ${sign(c.deltaBoostTargetKpa)} kPa.`,
      { bold: true },
    );
  }
  doc.moveDown(0.5);
  drawCurvePlot(doc, runs);
}

/** Renders the handover build report of one work order of one shop as a PDF. */
export async function renderHandoverReportPdf(db: Db, shopId: string, workOrderId: string): Promise<Buffer> {
  const d = await loadHandoverReport(db, shopId, workOrderId);
  if (!d) throw new ReportNotFoundError();
  const j = d.job;
  const doc = newPdf(`Build report: ${j.make} ${j.model}, ${j.tagCode}`);
  doc.font(FONT.bold).fontSize(20).text("Build report");
  doc
    .font(FONT.body)
    .fontSize(12)
    .text(pdfText(`${j.make} ${j.model} · ${j.tagCode} · work order #${j.number}`));
  doc
    .fontSize(10)
    .fillColor("#5b6773")
    .text(pdfText(`${j.shopName} · made ${day(new Date())}`))
    .fillColor("#111418");

  heading(doc, "The bike");
  theBike(doc, d);
  heading(doc, "Work done");
  workDone(doc, d);
  heading(doc, "Parts fitted");
  partsFitted(doc, d);
  heading(doc, "Measurements against spec");
  measurements(doc, d);
  heading(doc, "Torque applied");
  torqueApplied(doc, d);
  heading(doc, "Sign-offs and reviews");
  signOffs(doc, d);
  heading(doc, "Withdrawn entries");
  withdrawnEntries(doc, d);
  heading(doc, "Dyno results");
  dynoResults(doc, d);
  tuneSection(doc, await listTuneVersions(db, shopId, workOrderId));
  heading(doc, "Run-in advice");
  for (const line of RUN_IN_ADVICE) paragraph(doc, `• ${line}`);
  heading(doc, "Cautions");
  for (const line of CAUTIONS) paragraph(doc, `• ${line}`);
  const cautions = [
    ...new Set(
      d.steps
        .filter((s) => d.completed.some((c) => c.stepId === s.id))
        .flatMap((s) => (s.cautions as Array<{ text: string }>).map((c) => c.text)),
    ),
  ];
  if (cautions.length) {
    doc.moveDown(0.3);
    paragraph(doc, "Cautions from the procedures followed:", { bold: true });
    for (const c of cautions) paragraph(doc, `• ${c}`, { size: 9 });
  }
  footers(doc, `${j.shopName} · build report · ${j.tagCode} · #${j.number}`);
  return toBuffer(doc);
}
