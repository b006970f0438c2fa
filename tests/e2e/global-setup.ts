import { execFileSync } from "node:child_process";
import { mkdirSync } from "node:fs";
import path from "node:path";
import QRCode from "qrcode";

// A fake camera feed for the scan test: a QR tag made with the same library the tag labels use,
// padded onto a 640×480 frame and written as y4m, which Chromium plays as its camera
// (--use-file-for-fake-video-capture). ffmpeg comes from Debian (db/scripts/install-deps.sh --test).
export const FAKE_CAMERA_TAG = "GSW-0003";
export const fakeCameraFile = path.resolve(import.meta.dirname, ".generated", "tag-camera.y4m");

export default async function globalSetup() {
  const dir = path.dirname(fakeCameraFile);
  mkdirSync(dir, { recursive: true });
  const png = path.join(dir, "tag.png");
  await QRCode.toFile(png, FAKE_CAMERA_TAG, { width: 260, margin: 4 });
  execFileSync("ffmpeg", [
    "-y",
    "-loglevel",
    "error",
    "-loop",
    "1",
    "-i",
    png,
    "-vf",
    "pad=640:480:(ow-iw)/2:(oh-ih)/2:white,format=yuv420p",
    "-t",
    "2",
    "-r",
    "10",
    fakeCameraFile,
  ]);
}
