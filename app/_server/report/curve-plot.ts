import "server-only";
import { convertPower } from "@/lib/calc";
import { niceAxis, type DynoRunSummary } from "@/lib/dyno";
import { contentWidth, ensureSpace, FONT, INK, pdfText, STEEL, type Pdf } from "./pdf-layout";

const PDF_RUN_COLOURS = ["#1a56db", "#b4490c", "#0b6b2e", "#7e22ce"];

/**
 * Corrected power (solid, left scale, hp and kW) and torque (dashed, right scale, N·m) of each run,
 * drawn as vector paths from the data; a legend under the plot names each run.
 */
export function drawCurvePlot(doc: Pdf, runs: DynoRunSummary[]) {
  const height = 250;
  ensureSpace(doc, height + 40 + runs.length * 14);
  const left = doc.page.margins.left + 44;
  const width = contentWidth(doc) - 88;
  const top = doc.y + 10;
  const pts = runs.flatMap((r) => r.curve.points);
  const x = niceAxis(Math.min(...pts.map((p) => p.rpm)), Math.max(...pts.map((p) => p.rpm)), 7);
  const yp = niceAxis(0, Math.max(...pts.map((p) => p.correctedPowerKw)), 5);
  const yt = niceAxis(0, Math.max(...pts.map((p) => p.correctedTorqueNm)), 5);
  const sx = (rpm: number) => left + ((rpm - x.min) / (x.max - x.min)) * width;
  const syP = (v: number) => top + height - ((v - yp.min) / (yp.max - yp.min)) * height;
  const syT = (v: number) => top + height - ((v - yt.min) / (yt.max - yt.min)) * height;

  doc.save();
  doc.lineWidth(0.4).strokeColor("#c8cfd6");
  for (const t of x.ticks)
    doc
      .moveTo(sx(t), top)
      .lineTo(sx(t), top + height)
      .stroke();
  for (const t of yp.ticks)
    doc
      .moveTo(left, syP(t))
      .lineTo(left + width, syP(t))
      .stroke();
  doc.lineWidth(1).strokeColor(INK).rect(left, top, width, height).stroke();
  doc.font(FONT.figures).fontSize(7.5).fillColor(INK);
  for (const t of x.ticks) doc.text(String(t), sx(t) - 20, top + height + 4, { width: 40, align: "center", lineBreak: false });
  for (const t of yp.ticks) doc.text(String(t), left - 42, syP(t) - 4, { width: 38, align: "right", lineBreak: false });
  for (const t of yt.ticks) doc.text(String(t), left + width + 4, syT(t) - 4, { width: 38, align: "left", lineBreak: false });
  doc.font(FONT.body).fontSize(8.5);
  doc.text("Engine speed (rpm)", left, top + height + 16, { width, align: "center", lineBreak: false });
  doc.text("Power (kW), solid", left - 44, top - 12, { lineBreak: false });
  doc.text("Torque (N·m), dashed", left + width - 60, top - 12, { width: 104, align: "right", lineBreak: false });

  runs.forEach((r, i) => {
    const colour = PDF_RUN_COLOURS[i % PDF_RUN_COLOURS.length];
    const path = (y: (p: (typeof r.curve.points)[number]) => number) =>
      r.curve.points.forEach((p, j) => (j === 0 ? doc.moveTo(sx(p.rpm), y(p)) : doc.lineTo(sx(p.rpm), y(p))));
    doc.lineWidth(1.8).strokeColor(colour).undash();
    path((p) => syP(p.correctedPowerKw));
    doc.stroke();
    doc.dash(5, { space: 3 });
    path((p) => syT(p.correctedTorqueNm));
    doc.stroke();
    doc.undash();
  });
  doc.restore();

  doc.y = top + height + 32;
  runs.forEach((r, i) => {
    const colour = PDF_RUN_COLOURS[i % PDF_RUN_COLOURS.length];
    const y = doc.y + 5;
    doc
      .lineWidth(2)
      .strokeColor(colour)
      .moveTo(doc.page.margins.left, y)
      .lineTo(doc.page.margins.left + 26, y)
      .stroke();
    const peak = r.curve.peaks.correctedPowerKw;
    doc
      .font(FONT.body)
      .fontSize(9)
      .fillColor(INK)
      .text(
        pdfText(`${r.label}: ${peak.value.toFixed(1)} kW (${convertPower(peak.value, "kW", "hp").toFixed(1)} hp) at ${peak.rpm} rpm`),
        doc.page.margins.left + 32,
        doc.y,
        { width: contentWidth(doc) - 32 },
      );
  });
  doc
    .fillColor(STEEL)
    .fontSize(8)
    .text("Corrected figures; observed torque × correction factor of each run's standard.", doc.page.margins.left);
  doc.fillColor(INK).fontSize(10);
}
