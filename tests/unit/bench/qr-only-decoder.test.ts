import BarcodeFormat from "@zxing/library/esm/core/BarcodeFormat";
import EncodeHintType from "@zxing/library/esm/core/EncodeHintType";
import RGBLuminanceSource from "@zxing/library/esm/core/RGBLuminanceSource";
import QRCodeWriter from "@zxing/library/esm/core/qrcode/QRCodeWriter";
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
