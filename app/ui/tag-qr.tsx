import QRCode from "qrcode";

// The bike's tag as a QR code (SVG, made on the server) with the short code beneath it.
// The code holds only the tag text, which the bench scanner looks up.
export async function TagQr({ tagCode, size = 160 }: { tagCode: string; size?: number }) {
  const svg = await QRCode.toString(tagCode, { type: "svg", margin: 1, errorCorrectionLevel: "M" });
  return (
    <figure className="inline-flex flex-col items-center" data-testid="tag-qr">
      <div
        style={{ width: size, height: size }}
        role="img"
        aria-label={`QR code for tag ${tagCode}`}
        dangerouslySetInnerHTML={{ __html: svg }}
      />
      <figcaption className="font-mono text-xl font-bold tracking-wider">{tagCode}</figcaption>
    </figure>
  );
}
