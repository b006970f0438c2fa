import { describe, expect, it } from "vitest";
import { qrModules, qrPlacement, qrY4m } from "@/tests/e2e/support/y4m";

// The fake camera file is written from Node (no ffmpeg). Format: the YUV4MPEG2 header, then per
// frame "FRAME\n" + Y plane (W×H) + U and V planes (W/2 × H/2 each), as documented for y4m files
// (e.g. the MultimediaWiki "YUV4MPEG2" page); Chromium's fake capture reads exactly this.
describe("fake camera Y4M", () => {
  const width = 640;
  const height = 480;
  const frames = 3;
  const file = qrY4m("GSW-0003", { width, height, frames });
  const headerEnd = file.indexOf(0x0a) + 1;
  const header = file.subarray(0, headerEnd).toString("ascii");
  const frameBytes = 6 + width * height + 2 * (width / 2) * (height / 2);

  it("starts with a 4:2:0 header naming the size and frame rate", () => {
    expect(header).toBe("YUV4MPEG2 W640 H480 F10:1 Ip A1:1 C420jpeg\n");
  });

  it("holds whole frames, each marked FRAME", () => {
    expect(file.length).toBe(headerEnd + frames * frameBytes);
    for (let f = 0; f < frames; f++)
      expect(file.subarray(headerEnd + f * frameBytes, headerEnd + f * frameBytes + 6).toString("ascii")).toBe("FRAME\n");
  });

  it("draws every module of the code black on white in the Y plane, with neutral colour planes", () => {
    const modules = qrModules("GSW-0003");
    const { left, top, scale } = qrPlacement(modules.length, width, height, 260);
    const y = file.subarray(headerEnd + 6, headerEnd + 6 + width * height);
    let dark = 0;
    modules.forEach((row, r) =>
      row.forEach((isDark, c) => {
        const px = y[(top + r * scale + (scale >> 1)) * width + left + c * scale + (scale >> 1)];
        expect(px).toBe(isDark ? 0 : 255);
        if (isDark) dark++;
      }),
    );
    expect(dark).toBeGreaterThan(modules.length); // a real code, not a blank frame
    expect(y[0]).toBe(255); // white margin
    const uv = file.subarray(headerEnd + 6 + width * height, headerEnd + frameBytes);
    expect(uv.every((b) => b === 128)).toBe(true);
  });

  it("refuses an odd frame size, which 4:2:0 cannot hold", () => {
    expect(() => qrY4m("X", { width: 641 })).toThrow(/even/);
  });
});
