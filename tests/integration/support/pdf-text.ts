import { PDFParse } from "pdf-parse";

/** The text of a PDF (or of the pages given, from 1), whitespace folded to single spaces. */
export async function pdfText(bytes: Uint8Array, pages?: number[]): Promise<string> {
  const parser = new PDFParse({ data: new Uint8Array(bytes) });
  try {
    return (await parser.getText(pages ? { partial: pages } : undefined)).text.replace(/\s+/g, " ");
  } finally {
    await parser.destroy();
  }
}
