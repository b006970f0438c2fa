import "server-only";
import { fileSizeWords, tuneHandedOver, type TuneVersion } from "@/lib/dyno/tune-version";
import { heading, paragraph, pdfText, table, type Pdf } from "./pdf-layout";
import { shopDay } from "./report-rows";

/**
 * The build report's tune section: the tune handed over (the newest version) with its whole SHA-256,
 * so the file on the bike can be checked against it, and the earlier versions.
 */
export function tuneSection(doc: Pdf, tunes: readonly TuneVersion[], timeZone: string) {
  const day = (iso: string) => shopDay(timeZone, iso);
  heading(doc, "Tune");
  const handed = tuneHandedOver(tunes);
  if (!handed) return paragraph(doc, "No tune file was recorded on this work order.");
  paragraph(doc, `Tune handed over: ${handed.label}`, { bold: true });
  paragraph(
    doc,
    `File ${handed.fileName}, ${fileSizeWords(handed.sizeBytes)}, uploaded by ${handed.uploadedBy} on ${day(handed.uploadedAt)}.`,
  );
  if (handed.notes) paragraph(doc, handed.notes, { size: 9 });
  doc.moveDown(0.2);
  paragraph(doc, "SHA-256 of the file (the same file gives the same figure):", { size: 9 });
  doc.font("Courier").fontSize(9.5).text(pdfText(handed.sha256));
  doc.font("Helvetica").fontSize(10);
  const earlier = tunes.filter((t) => t.id !== handed.id);
  if (earlier.length) {
    doc.moveDown(0.4);
    table(
      doc,
      [
        { header: "Earlier version", width: 0.3 },
        { header: "Uploaded", width: 0.2 },
        { header: "SHA-256 (first 16 digits)", width: 0.5, figures: true },
      ],
      earlier.map((t) => [t.label, `${day(t.uploadedAt)}, ${t.uploadedBy}`, t.sha256.slice(0, 16)]),
    );
  }
}
