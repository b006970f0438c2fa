/**
 * Tune versions of a work order: the file loaded on the bike (any file: a calibration, a map, a
 * project file of the tuning software), kept byte for byte in object storage with its SHA-256, a
 * version label, notes, who uploaded it and when. Nothing is replaced: a new tune is a new version.
 * The tune handed over is the newest version at handover (or now, before it). Pure rules.
 */
import { z } from "zod";
import { safeText } from "@/lib/safe-values";

/** The largest tune file taken, bytes (16 MiB: calibration files are kilobytes to a few megabytes). */
export const TUNE_FILE_MAX_BYTES = 16 * 1024 * 1024;

export const tuneFieldsSchema = z.object({
  label: safeText({ label: "Version label", max: 80, min: 1, tooShort: "Give the tune a version label (e.g. “v3 10 psi E85”)." }),
  notes: safeText({ label: "Notes", max: 2000, multiline: true }).default(""),
});
export type TuneFields = z.output<typeof tuneFieldsSchema>;

export const tuneFileNameSchema = safeText({ label: "File name", max: 200, min: 1, tooShort: "The file has no name." });

/** A stored tune version as pages and the report show it. */
export interface TuneVersion {
  id: string;
  label: string;
  notes: string;
  fileName: string;
  sizeBytes: number;
  sha256: string;
  uploadedBy: string;
  uploadedAt: string;
}

/** The tune handed over: the newest version (uploaded last), or null when the work order has none. */
export function tuneHandedOver<T extends { uploadedAt: string }>(versions: readonly T[]): T | null {
  return versions.reduce<T | null>((newest, v) => (newest === null || v.uploadedAt >= newest.uploadedAt ? v : newest), null);
}

/** Size in words: "812 bytes", "48.3 kB", "2.41 MB". */
export function fileSizeWords(bytes: number): string {
  if (bytes < 1000) return `${bytes} bytes`;
  if (bytes < 1_000_000) return `${(bytes / 1000).toFixed(1)} kB`;
  return `${(bytes / 1_000_000).toFixed(2)} MB`;
}

/** A SHA-256 in groups of eight hex digits, easier to read aloud and compare: "9f86d081 884c7d65 …". */
export function groupedHash(sha256: string): string {
  return sha256.replace(/(.{8})(?=.)/g, "$1 ");
}
