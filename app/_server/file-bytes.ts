import "server-only";
import { fileTypeFromBuffer } from "file-type";

// What a file is, read from its own first bytes (its magic number: JPEG FF D8 FF, PNG 89 50 4E 47,
// WebP "RIFF….WEBP", HEIF/HEIC "ftyp" brands, PDF "%PDF-"), never from the type the sender
// declared. The `file-type` package reads the signatures.

/** The media type of the bytes, or null when they are none the package knows. */
export async function typeByBytes(bytes: Uint8Array): Promise<string | null> {
  const found = await fileTypeFromBuffer(bytes.subarray(0, 4100));
  return found?.mime ?? null;
}

// HEIC and HEIF are one container: a photo declared as either may be read as either.
const SAME_KIND: Record<string, string> = { "image/heic": "image/heif", "image/heif": "image/heif" };
const kind = (type: string) => SAME_KIND[type] ?? type;

/** True when the bytes are of the declared type (HEIC/HEIF counted as one). */
export async function bytesAreOfType(bytes: Uint8Array, declared: string): Promise<boolean> {
  const found = await typeByBytes(bytes);
  return found !== null && kind(found) === kind(declared);
}
