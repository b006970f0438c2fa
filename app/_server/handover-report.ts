import "server-only";
import { loadHandoverReport, type HandoverReportData } from "@/db/records/handover-report";
import { openItemsSummary } from "@/lib/work-orders/open-items";
import { drawCurvePlot } from "./report/curve-plot";
import { tuneSection } from "./report/tune-section";
import { FONT, footers, heading, newPdf, paragraph, pdfText, table, toBuffer, type Pdf } from "./report/pdf-layout";
import {
  bikeRows,
  boreLines,
  shopDay,
  dynoComparison,
  dynoRows,
  flaggedRows,
  openItemLines,
  overrideBlocks,
  partRows,
  procedureLine,
  readingRows,
  readingsSummary,
  reportLines,
  buildFigureReportRows,
  buildFigureNotes,
  runsOf,
  signOffRows,
  torqueRows,
  withdrawnRows,
  workDoneRows,
} from "./report/report-rows";
import type { Db } from "@/db/setup/client";

// The build report: a PDF for the customer and the shop's records, made on the server from the
// database (no browser). What it prints is in ./report/report-rows.ts; this file lays it out.
// At handover a copy is stored and never changes; later accepted changes make numbered
// revisions (./frozen-report.ts), each saying on page one what changed.

export class ReportNotFoundError extends Error {
  constructor() {
    super("No such work order in this shop.");
  }
}

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

/** A stored copy's place among the copies: revision 1 is the one handed over. */
export interface RevisionHeading {
  number: number;
  /** When the job was handed over (revision 1 is made then). */
  handedOverAt: Date;
  /** What changed since the revision before (empty for revision 1). */
  changes: readonly string[];
}

function revisionBlock(doc: Pdf, r: RevisionHeading, timeZone: string) {
  const day = (at: Date) => shopDay(timeZone, at);
  doc.moveDown(0.4);
  if (r.number === 1) {
    paragraph(doc, `Revision 1: the report as handed over on ${day(r.handedOverAt)}.`, { bold: true });
    return;
  }
  paragraph(doc, `Revision ${r.number} of the report handed over on ${day(r.handedOverAt)} (revision 1).`, { bold: true });
  paragraph(doc, `Changed since revision ${r.number - 1}:`, { size: 9 });
  for (const c of r.changes) paragraph(doc, `• ${c}`, { size: 9 });
}

function overridesBlock(doc: Pdf, d: HandoverReportData) {
  for (const b of overrideBlocks(d)) {
    doc.moveDown(0.5);
    paragraph(doc, b.title, { bold: true, colour: "#8a1c1c", size: 11 });
    paragraph(doc, b.who);
    paragraph(doc, "Open at that moment:", { size: 9 });
    for (const i of b.items) paragraph(doc, `• ${i}`, { size: 9 });
  }
}

function workDone(doc: Pdf, d: HandoverReportData) {
  if (d.procedures.length === 0) paragraph(doc, "No procedures were run on this work order.");
  for (const p of d.procedures) {
    paragraph(doc, procedureLine(d, p), { bold: true });
    if (p.exampleOnly) paragraph(doc, "This procedure's figures were example figures; see the cautions at the end.", { size: 8.5 });
    table(
      doc,
      [
        { header: "Stage", width: 0.28 },
        { header: "Step", width: 0.47 },
        { header: "Done", width: 0.25 },
      ],
      workDoneRows(d, p.versionId),
    );
    doc.moveDown(0.5);
  }
}

function measurements(doc: Pdf, d: HandoverReportData) {
  if (d.readings.length === 0) return paragraph(doc, "No readings recorded.");
  table(
    doc,
    [
      { header: "Reading", width: 0.3 },
      { header: "Value", width: 0.14, figures: true, align: "right" },
      { header: "Spec (min to max)", width: 0.24, figures: true },
      { header: "Verdict", width: 0.32 },
    ],
    readingRows(d),
  );
  paragraph(doc, readingsSummary(d), { bold: true });
  for (const line of boreLines(d)) paragraph(doc, line);
}

function buildFigures(doc: Pdf, d: HandoverReportData) {
  const rows = buildFigureReportRows(d);
  if (rows.length === 0) paragraph(doc, "Not enough readings or build sheet figures to work out the compression figures.");
  else
    table(
      doc,
      [
        { header: "Figure", width: 0.52 },
        { header: "This build", width: 0.2, figures: true },
        { header: "Target", width: 0.28, figures: true },
      ],
      rows,
    );
  for (const line of buildFigureNotes(d)) paragraph(doc, line, { size: 9 });
}

function dynoResults(doc: Pdf, d: HandoverReportData) {
  if (d.runs.length === 0) return paragraph(doc, "No dyno runs recorded.");
  const runs = runsOf(d);
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
    dynoRows(runs),
  );
  for (const r of runs) {
    if (r.validity && !r.validity.inside) {
      paragraph(doc, `${r.label}: outside the correction's validity range. ${r.validity.outside.map((o) => o.message).join(" ")}`, {
        size: 9,
      });
    }
  }
  for (const r of runs.filter((x) => x.notes)) paragraph(doc, `${r.label}: ${r.notes}`, { size: 9 });
  const comparison = dynoComparison(runs);
  if (comparison) {
    doc.moveDown(0.3);
    paragraph(doc, comparison, { bold: true });
  }
  doc.moveDown(0.5);
  drawCurvePlot(doc, runs);
}

function draw(doc: Pdf, d: HandoverReportData, revision: RevisionHeading | null) {
  const j = d.job;
  doc.font(FONT.bold).fontSize(20).text("Build report");
  doc
    .font(FONT.body)
    .fontSize(12)
    .text(pdfText(`${j.make} ${j.model} · ${j.tagCode} · work order #${j.number}`));
  doc
    .fontSize(10)
    .fillColor("#5b6773")
    .text(pdfText(`${j.shopName} · made ${shopDay(j.timeZone, new Date())}`))
    .fillColor("#111418");
  if (revision) revisionBlock(doc, revision, j.timeZone);
  overridesBlock(doc, d);

  heading(doc, "The bike");
  table(
    doc,
    [
      { header: "", width: 0.28 },
      { header: "", width: 0.72 },
    ],
    bikeRows(d),
  );
  heading(doc, "Work done");
  workDone(doc, d);
  heading(doc, "Parts fitted");
  if (d.parts.length === 0) paragraph(doc, "No parts recorded.");
  else
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
      partRows(d),
    );
  heading(doc, "Measurements against spec");
  measurements(doc, d);
  heading(doc, "Build figures");
  buildFigures(doc, d);
  heading(doc, "Torque applied");
  const torque = torqueRows(d);
  if (torque.length === 0) paragraph(doc, "No torque work recorded yet.");
  else
    table(
      doc,
      [
        { header: "Fastening", width: 0.26 },
        { header: "Final value", width: 0.17, figures: true },
        { header: "Passes", width: 0.23 },
        { header: "Bolts × passes recorded", width: 0.18 },
        { header: "Notes", width: 0.16 },
      ],
      torque,
    );
  heading(doc, "Sign-offs and reviews");
  if (d.signOffs.length === 0) paragraph(doc, "No stage signed off yet.");
  else
    table(
      doc,
      [
        { header: "Stage", width: 0.26 },
        { header: "Signed off", width: 0.25 },
        { header: "Review", width: 0.49 },
      ],
      signOffRows(d),
    );
  if (d.flagged.length) {
    doc.moveDown(0.4);
    paragraph(doc, "Entries flagged for the supervisor", { bold: true });
    table(
      doc,
      [
        { header: "Entry", width: 0.36 },
        { header: "Why it was flagged", width: 0.32 },
        { header: "Accepted", width: 0.32 },
      ],
      flaggedRows(d),
    );
  }
  heading(doc, "Withdrawn entries");
  const withdrawn = withdrawnRows(d);
  if (withdrawn.length === 0) paragraph(doc, "Nothing was withdrawn.");
  else
    table(
      doc,
      [
        { header: "Entry", width: 0.36 },
        { header: "Recorded", width: 0.2 },
        { header: "Withdrawn", width: 0.2 },
        { header: "Why", width: 0.24 },
      ],
      withdrawn,
    );
  heading(doc, "Still open on the record");
  const open = openItemLines(d);
  if (open.length === 0) paragraph(doc, "Nothing: every stage is signed off and approved, and every flagged entry accepted.");
  else {
    paragraph(doc, `${openItemsSummary(d.openItems)}:`, { bold: true });
    for (const line of open) paragraph(doc, `• ${line}`, { size: 9 });
  }
  heading(doc, "Dyno results");
  dynoResults(doc, d);
  tuneSection(doc, d.tunes, d.job.timeZone);
  heading(doc, "Run-in advice");
  for (const line of RUN_IN_ADVICE) paragraph(doc, `• ${line}`);
  heading(doc, "Cautions");
  for (const line of CAUTIONS) paragraph(doc, `• ${line}`);
  const cautions = [...new Set(d.steps.filter((s) => s.done).flatMap((s) => (s.cautions as Array<{ text: string }>).map((c) => c.text)))];
  if (cautions.length) {
    doc.moveDown(0.3);
    paragraph(doc, "Cautions from the procedures followed:", { bold: true });
    for (const c of cautions) paragraph(doc, `• ${c}`, { size: 9 });
  }
  const rev = revision ? ` · revision ${revision.number}` : "";
  footers(doc, `${j.shopName} · build report · ${j.tagCode} · #${j.number}${rev}`);
}

/** The build report of one work order of one shop: the PDF and the lines it printed (see reportLines). */
export async function renderBuildReport(
  db: Db,
  shopId: string,
  workOrderId: string,
  revision: RevisionHeading | null = null,
): Promise<{ pdf: Buffer; lines: string[] }> {
  const d = await loadHandoverReport(db, shopId, workOrderId);
  if (!d) throw new ReportNotFoundError();
  const doc = newPdf(`Build report: ${d.job.make} ${d.job.model}, ${d.job.tagCode}`);
  draw(doc, d, revision);
  return { pdf: await toBuffer(doc), lines: reportLines(d) };
}

/** The lines the report of a work order prints now, without making the PDF (null: not the shop's). */
export async function currentReportLines(db: Db, shopId: string, workOrderId: string): Promise<string[] | null> {
  const d = await loadHandoverReport(db, shopId, workOrderId);
  return d ? reportLines(d) : null;
}

/** Renders the build report of one work order of one shop as a PDF, as the record stands now. */
export async function renderHandoverReportPdf(db: Db, shopId: string, workOrderId: string): Promise<Buffer> {
  return (await renderBuildReport(db, shopId, workOrderId)).pdf;
}
