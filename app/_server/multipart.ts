import "server-only";
import { Readable } from "node:stream";
import busboy from "busboy";
import { Refusal } from "@/lib/errors";
import { storableContentType, storableFileName } from "@/lib/safe-values";

/** Limits of a multipart form, enforced while it streams in. */
export interface MultipartLimits {
  /** The whole body. */
  maxBytes: number;
  /** Each file. */
  maxFileBytes: number;
  maxFiles: number;
  /** Text fields: how many, and the bytes of each. */
  maxFields?: number;
  maxFieldBytes?: number;
  /** Said after a size refusal, e.g. "A tune file may be at most 16 MiB." */
  tooLargeHint?: string;
}

const mib = (n: number) => `${Math.round((n / (1024 * 1024)) * 10) / 10} MB`;

/**
 * Reads a multipart form with busboy as it streams: a file is refused (413) the moment it passes
 * its limit, so a 50 MB photo is never held whole when 10 MB is the most; the whole body is counted
 * too. The answer is a FormData (files as File objects) for the handler.
 */
export async function readMultipart(req: Request, limits: MultipartLimits): Promise<FormData> {
  const hint = limits.tooLargeHint ? ` ${limits.tooLargeHint}` : "";
  const declared = req.headers.get("content-length");
  if (declared !== null && Number(declared) > limits.maxBytes)
    throw new Refusal(`The form is ${declared} bytes; the limit is ${limits.maxBytes} bytes.${hint}`, 413);
  if (!req.body) throw new Refusal("The form could not be read: send it again.", 400);
  const headers = Object.fromEntries(req.headers);
  const fieldBytes = limits.maxFieldBytes ?? 64 * 1024;
  let parser: busboy.Busboy;
  try {
    parser = busboy({
      headers,
      // browsers send a file's name as UTF-8 in filename="…"; busboy would read it as Latin-1
      defParamCharset: "utf8",
      limits: {
        fileSize: limits.maxFileBytes,
        files: limits.maxFiles,
        fields: limits.maxFields ?? 50,
        fieldSize: fieldBytes,
        parts: limits.maxFiles + (limits.maxFields ?? 50),
      },
    });
  } catch {
    throw new Refusal("The form could not be read: send it again.", 400);
  }
  const form = new FormData();
  const source = Readable.fromWeb(req.body as import("node:stream/web").ReadableStream<Uint8Array>);
  let total = 0;
  return new Promise<FormData>((resolve, reject) => {
    let failed = false;
    const fail = (e: Refusal) => {
      if (failed) return;
      failed = true;
      source.unpipe(parser);
      source.destroy();
      reject(e);
    };
    source.on("data", (chunk: Buffer) => {
      total += chunk.byteLength;
      if (total > limits.maxBytes) fail(new Refusal(`The form is over ${limits.maxBytes} bytes, the limit.${hint}`, 413));
    });
    source.on("error", () => fail(new Refusal("The form could not be read: send it again.", 400)));
    parser.on("field", (name, value, info) => {
      if (info.valueTruncated)
        fail(
          new Refusal(`A text in the form is longer than ${Math.round(fieldBytes / 1024)} kB: shorten it.`, 413, [
            { path: name, message: "too long" },
          ]),
        );
      else form.append(name, value);
    });
    parser.on("file", (name, stream, raw) => {
      // the name and declared type as they can be stored and shown (a NUL in a name once lost photos)
      const info = { filename: raw.filename ? storableFileName(raw.filename) : "", mimeType: storableContentType(raw.mimeType) };
      const chunks: Buffer[] = [];
      stream.on("data", (c: Buffer) => chunks.push(c));
      stream.on("limit", () =>
        fail(
          new Refusal(`${info.filename || "A file"} is larger than ${mib(limits.maxFileBytes)}.${hint}`, 413, [
            { path: name, message: `${info.filename}: over ${mib(limits.maxFileBytes)}` },
          ]),
        ),
      );
      stream.on("end", () => {
        if (!failed) form.append(name, new File(chunks as Uint8Array<ArrayBuffer>[], info.filename || "file", { type: info.mimeType }));
      });
    });
    parser.on("filesLimit", () => fail(new Refusal(`Attach at most ${limits.maxFiles} files at once.`, 413)));
    parser.on("fieldsLimit", () => fail(new Refusal("The form has too many fields.", 413)));
    parser.on("partsLimit", () => fail(new Refusal("The form has too many parts.", 413)));
    parser.on("error", () => fail(new Refusal("The form could not be read: send it again.", 400)));
    parser.on("close", () => {
      if (!failed) resolve(form);
    });
    source.pipe(parser);
  });
}
