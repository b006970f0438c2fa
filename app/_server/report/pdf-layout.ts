import "server-only";
import PDFDocument from "pdfkit";

// Page set-up and small layout helpers for Benchtag's PDF documents (pdfkit, A4).
// The PDF standard fonts are used: nothing is embedded, and a report renders in well under a
// second (our WOFF2 faces cost seconds of JavaScript Brotli decoding per document). Their
// WinAnsi character set lacks a few signs, which {@link pdfText} replaces.

export type Pdf = PDFKit.PDFDocument;

export const FONT = { body: "Helvetica", bold: "Helvetica-Bold", figures: "Helvetica" } as const;

const REPLACE: Record<string, string> = { "−": "-", "≤": "<=", "≥": ">=", "✓": "", "✕": "x", "→": "->", "…": "...", μ: "µ" };

/** Text safe for the standard fonts' WinAnsi encoding: known signs replaced, others as "?". */
export function pdfText(s: string): string {
  return [...s]
    .map((ch) => {
      if (ch in REPLACE) return REPLACE[ch];
      const c = ch.codePointAt(0)!;
      return c < 0x100 || "€‚ƒ„†‡ˆ‰Š‹ŒŽ‘’“”•–—˜™š›œžŸ".includes(ch) ? ch : "?";
    })
    .join("");
}
const MARGIN = 48;
export const INK = "#111418";
export const STEEL = "#5b6773";

export function newPdf(title: string): Pdf {
  const doc = new PDFDocument({
    size: "A4",
    margin: MARGIN,
    bufferPages: true,
    info: { Title: pdfText(title), Creator: "Benchtag" },
  });
  doc.font(FONT.body).fontSize(10).fillColor(INK);
  return doc;
}

export const contentWidth = (doc: Pdf) => doc.page.width - doc.page.margins.left - doc.page.margins.right;
const bottom = (doc: Pdf) => doc.page.height - doc.page.margins.bottom;

/** Starts a new page unless `height` points still fit below the cursor. */
export function ensureSpace(doc: Pdf, height: number) {
  if (doc.y + height > bottom(doc)) doc.addPage();
}

export function heading(doc: Pdf, text: string) {
  ensureSpace(doc, 60);
  doc.moveDown(0.8);
  doc.font(FONT.bold).fontSize(14).fillColor(INK).text(pdfText(text), doc.page.margins.left);
  const y = doc.y + 2;
  doc
    .moveTo(doc.page.margins.left, y)
    .lineTo(doc.page.margins.left + contentWidth(doc), y)
    .lineWidth(1)
    .strokeColor(INK)
    .stroke();
  doc.moveDown(0.5);
  doc.font(FONT.body).fontSize(10);
}

export function paragraph(doc: Pdf, text: string, opts: { bold?: boolean; colour?: string; size?: number } = {}) {
  doc
    .font(opts.bold ? FONT.bold : FONT.body)
    .fontSize(opts.size ?? 10)
    .fillColor(opts.colour ?? INK)
    .text(pdfText(text), doc.page.margins.left, doc.y, { width: contentWidth(doc) });
  doc.fillColor(INK);
}

export interface Column {
  header: string;
  /** Share of the content width. */
  width: number;
  align?: "left" | "right";
  figures?: boolean;
}

/** A simple ruled table; repeats the header after a page break. */
export function table(doc: Pdf, columns: Column[], rows: string[][]) {
  const left = doc.page.margins.left;
  const total = contentWidth(doc);
  const widths = columns.map((c) => c.width * total);
  const drawRow = (raw: string[], header: boolean) => {
    const cells = raw.map(pdfText);
    doc.font(header ? FONT.bold : FONT.body).fontSize(9);
    const heights = cells.map((c, i) => doc.heightOfString(c, { width: widths[i] - 6 }));
    const h = Math.max(...heights, 10) + 6;
    if (doc.y + h > bottom(doc)) {
      doc.addPage();
      if (!header)
        drawRow(
          columns.map((c) => c.header),
          true,
        );
    }
    const y = doc.y;
    let x = left;
    cells.forEach((c, i) => {
      doc.font(header ? FONT.bold : columns[i].figures ? FONT.figures : FONT.body).fontSize(columns[i].figures && !header ? 8.5 : 9);
      doc.text(c, x + 3, y + 3, { width: widths[i] - 6, align: columns[i].align ?? "left" });
      x += widths[i];
    });
    doc
      .moveTo(left, y + h)
      .lineTo(left + total, y + h)
      .lineWidth(header ? 1 : 0.4)
      .strokeColor(header ? INK : "#a9b3bd")
      .stroke();
    doc.y = y + h;
  };
  drawRow(
    columns.map((c) => c.header),
    true,
  );
  for (const r of rows) drawRow(r, false);
  doc.x = left;
  doc.font(FONT.body).fontSize(10);
}

/** Page footer on every buffered page: shop, report, page n of m. */
export function footers(doc: Pdf, text: string) {
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    const margin = doc.page.margins.bottom;
    const y = doc.page.height - margin + 16;
    doc.page.margins.bottom = 0; // writing below the margin would otherwise start a new page
    doc.font(FONT.body).fontSize(8).fillColor(STEEL);
    doc.text(`${pdfText(text)} · page ${i + 1} of ${range.count}`, doc.page.margins.left, y, {
      width: contentWidth(doc),
      align: "center",
      lineBreak: false,
    });
    doc.page.margins.bottom = margin;
  }
  doc.fillColor(INK);
}

export function toBuffer(doc: Pdf): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = [];
    doc.on("data", (c: Buffer) => chunks.push(c));
    doc.on("end", () => resolve(Buffer.concat(chunks)));
    doc.on("error", reject);
    doc.end();
  });
}
