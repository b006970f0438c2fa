import { mkdirSync, writeFileSync } from "node:fs";
import path from "node:path";
import { qrY4m } from "./support/y4m";

// A fake camera feed for the scan test: the tag's QR code, made with the same library the tag
// labels use, centred in a white 640×480 frame and written as Y4M, which Chromium plays as its
// camera (--use-file-for-fake-video-capture). Written in TypeScript, so no ffmpeg is needed.
export const FAKE_CAMERA_TAG = "GSW-0003";
export const fakeCameraFile = path.resolve(import.meta.dirname, ".generated", "tag-camera.y4m");

export default async function globalSetup() {
  mkdirSync(path.dirname(fakeCameraFile), { recursive: true });
  writeFileSync(fakeCameraFile, qrY4m(FAKE_CAMERA_TAG));
}
