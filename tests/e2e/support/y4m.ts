import QRCode from "qrcode";

// A fake camera feed written without ffmpeg. A Y4M (YUV4MPEG2) file is a one-line text header and,
// per frame, "FRAME\n" followed by the raw planes of 4:2:0 video: Y (width × height bytes), then
// U and V (width/2 × height/2 bytes each). Grey and white have U = V = 128.

export interface Y4mOptions {
  width?: number;
  height?: number;
  frames?: number;
  fps?: number;
  /** Side of the code in pixels, quiet zone included (about 260 px decodes well at 640×480). */
  codeSize?: number;
}

/** The QR code of `text` as rows of dark (true) and light (false) modules, quiet zone excluded. */
export function qrModules(text: string): boolean[][] {
  const qr = QRCode.create(text, { errorCorrectionLevel: "M" });
  const n = qr.modules.size;
  return Array.from({ length: n }, (_, r) => Array.from({ length: n }, (_, c) => qr.modules.get(r, c) === 1));
}

/** Where the code's modules land in the frame: top-left corner and pixels per module. */
export function qrPlacement(moduleCount: number, width: number, height: number, codeSize: number) {
  const quiet = 4;
  const scale = Math.max(1, Math.floor(codeSize / (moduleCount + 2 * quiet)));
  const side = moduleCount * scale;
  return { left: Math.floor((width - side) / 2), top: Math.floor((height - side) / 2), scale };
}

/** A Y4M video of `text` as a black-on-white QR code centred in a white frame. */
export function qrY4m(text: string, options: Y4mOptions = {}): Buffer {
  const { width = 640, height = 480, frames = 20, fps = 10, codeSize = 260 } = options;
  if (width % 2 || height % 2) throw new Error("Y4M 4:2:0 needs an even width and height.");
  const modules = qrModules(text);
  const { left, top, scale } = qrPlacement(modules.length, width, height, codeSize);

  const luma = Buffer.alloc(width * height, 255);
  modules.forEach((row, r) =>
    row.forEach((dark, c) => {
      if (!dark) return;
      for (let y = 0; y < scale; y++)
        luma.fill(0, (top + r * scale + y) * width + left + c * scale, (top + r * scale + y) * width + left + (c + 1) * scale);
    }),
  );
  const chroma = Buffer.alloc((width / 2) * (height / 2) * 2, 128);
  const frame = Buffer.concat([Buffer.from("FRAME\n", "ascii"), luma, chroma]);
  const header = Buffer.from(`YUV4MPEG2 W${width} H${height} F${fps}:1 Ip A1:1 C420jpeg\n`, "ascii");
  return Buffer.concat([header, ...Array.from({ length: frames }, () => frame)]);
}
