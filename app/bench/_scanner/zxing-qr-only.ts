// What html5-qrcode's decoder takes from its bundled ZXing build (1.1 MB, every barcode format and
// the encoders), served from @zxing/library's own modules for QR codes only: a bike's tag is a QR
// code. next.config.mjs points html5-qrcode's import of that bundle here, which keeps the scanner's
// chunk to the QR reader (issue 17: the bench's precache). The names and call shapes are the ones
// html5-qrcode uses (third_party/zxing-js.umd.d.ts).
import BarcodeFormat from "@zxing/library/esm/core/BarcodeFormat";
import BinaryBitmap from "@zxing/library/esm/core/BinaryBitmap";
import HybridBinarizer from "@zxing/library/esm/core/common/HybridBinarizer";
import DecodeHintType from "@zxing/library/esm/core/DecodeHintType";
import NotFoundException from "@zxing/library/esm/core/NotFoundException";
import QRCodeReader from "@zxing/library/esm/core/qrcode/QRCodeReader";
import type Result from "@zxing/library/esm/core/Result";
import { HTMLCanvasElementLuminanceSource } from "@zxing/library/esm/browser/HTMLCanvasElementLuminanceSource";

/** html5-qrcode's `new MultiFormatReader(verbose, hints).decode(bitmap)`, reading QR codes only. */
class MultiFormatReader {
  private readonly reader = new QRCodeReader();
  constructor(
    _verbose: boolean,
    private readonly hints: Map<DecodeHintType, unknown>,
  ) {}

  decode(bitmap: BinaryBitmap): Result {
    const formats = this.hints.get(DecodeHintType.POSSIBLE_FORMATS) as BarcodeFormat[] | undefined;
    // asked for no QR code: nothing this reader can find (html5-qrcode treats a throw as "no code in this frame")
    if (formats && !formats.includes(BarcodeFormat.QR_CODE)) throw new NotFoundException();
    return this.reader.decode(bitmap, this.hints);
  }
}

export { BarcodeFormat, BinaryBitmap, DecodeHintType, HTMLCanvasElementLuminanceSource, HybridBinarizer, MultiFormatReader };
