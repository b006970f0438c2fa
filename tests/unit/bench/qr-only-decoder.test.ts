import BarcodeFormat from "@zxing/library/esm/core/BarcodeFormat";
import EncodeHintType from "@zxing/library/esm/core/EncodeHintType";
import RGBLuminanceSource from "@zxing/library/esm/core/RGBLuminanceSource";
import QRCodeWriter from "@zxing/library/esm/core/qrcode/QRCodeWriter";
import { readFileSync } from "node:fs";
import { createRequire } from "node:module";
import { describe, expect, it } from "vitest";
import * as ZXing from "@/app/bench/_scanner/zxing-qr-only";

// The stand-in for html5-qrcode's bundled ZXing (app/bench/_scanner/zxing-qr-only.ts), called the
// way html5-qrcode's decoder calls it: new MultiFormatReader(verbose, hints).decode(bitmap). The
// picture is a QR code drawn by ZXing's own writer as grey levels, like a camera frame (the camera
// test in tests/e2e/bench-camera.spec.ts reads a real one through the browser).

function frameOf(text: string): InstanceType<typeof ZXing.BinaryBitmap> {
  const hints = new Map([[EncodeHintType.MARGIN, 4]]);
  const matrix = new QRCodeWriter().encode(text, BarcodeFormat.QR_CODE, 200, 200, hints);
  const grey = new Uint8ClampedArray(matrix.getWidth() * matrix.getHeight());
  for (let y = 0; y < matrix.getHeight(); y++)
    for (let x = 0; x < matrix.getWidth(); x++) grey[y * matrix.getWidth() + x] = matrix.get(x, y) ? 0 : 255;
  const source = new RGBLuminanceSource(grey, matrix.getWidth(), matrix.getHeight());
  return new ZXing.BinaryBitmap(new ZXing.HybridBinarizer(source));
}

const hintsFor = (formats: number[]) =>
  new Map<number, unknown>([
    [ZXing.DecodeHintType.POSSIBLE_FORMATS, formats],
    [ZXing.DecodeHintType.TRY_HARDER, false],
  ]);

describe("the scanner's QR-only decoder", () => {
  it("reads a bike's tag from a QR code, with the text and format html5-qrcode takes from the result", () => {
    const reader = new ZXing.MultiFormatReader(false, hintsFor([ZXing.BarcodeFormat.QR_CODE]));
    const result = reader.decode(frameOf("GSW-0003"));
    expect(result.getText()).toBe("GSW-0003");
    // html5-qrcode reads these two fields directly
    expect((result as unknown as { text: string }).text).toBe("GSW-0003");
    expect((result as unknown as { format: number }).format).toBe(ZXing.BarcodeFormat.QR_CODE);
  });

  it("finds nothing in a blank frame, by throwing as the full decoder does (html5-qrcode counts it as no code yet)", () => {
    const reader = new ZXing.MultiFormatReader(false, hintsFor([ZXing.BarcodeFormat.QR_CODE]));
    const blank = new ZXing.BinaryBitmap(
      new ZXing.HybridBinarizer(new RGBLuminanceSource(new Uint8ClampedArray(200 * 200).fill(255), 200, 200)),
    );
    expect(() => reader.decode(blank)).toThrow();
  });

  it("asked for other formats only, reads nothing, even from a QR code", () => {
    const reader = new ZXing.MultiFormatReader(false, hintsFor([ZXing.BarcodeFormat.CODE_128]));
    expect(() => reader.decode(frameOf("GSW-0003"))).toThrow();
  });
});

describe("the alias that hands html5-qrcode this decoder", () => {
  // If an update of html5-qrcode moved or renamed its ZXing import, the alias in next.config.mjs
  // would stop applying and the 1.1 MB build would be bundled again without a word: checked here.
  const decoderFile = createRequire(import.meta.url).resolve("html5-qrcode/esm/zxing-html5-qrcode-decoder.js");
  const decoder = readFileSync(decoderFile, "utf8");
  const config = readFileSync(new URL("../../../next.config.mjs", import.meta.url), "utf8");

  it("names the very import html5-qrcode's decoder makes", () => {
    const imported = /import \* as ZXing from "([^"]+)"/.exec(decoder)?.[1];
    expect(imported).toBe("../third_party/zxing-js.umd");
    expect(config).toContain(`"${imported}": "./app/bench/_scanner/zxing-qr-only.ts"`);
  });

  it("gives every name the decoder takes from ZXing", () => {
    const used = new Set([...decoder.matchAll(/ZXing\.([A-Za-z]+)/g)].map((m) => m[1]));
    expect(used.size).toBeGreaterThan(0);
    for (const name of used) expect(ZXing, name).toHaveProperty(name);
  });
});
