"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { formatDayTime } from "@/lib/format/dates";
import { fileSizeWords, groupedHash, TUNE_FILE_MAX_BYTES, type TuneVersion } from "@/lib/dyno/tune-version";
import type { ErrorBody } from "@/lib/errors";
import { FormStatus, type FormOutcome } from "./form-status";

const input = "min-h-14 w-full rounded-lg border-2 border-steel-700 bg-white px-3 text-lg";

// The tunes loaded on this bike, newest first, each with its SHA-256; and the upload of a new one.
export function TuneVersions({ workOrderId, tunes }: { workOrderId: string; tunes: TuneVersion[] }) {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [message, setMessage] = useState<FormOutcome | null>(null);
  const newest = tunes.at(-1);

  async function upload(form: HTMLFormElement) {
    setBusy(true);
    setMessage(null);
    setErrors({});
    const data = new FormData(form);
    const file = data.get("file");
    if (typeof file === "object" && file !== null && file.size > TUNE_FILE_MAX_BYTES) {
      setErrors({ file: `The tune file is ${fileSizeWords(file.size)}; the limit is ${fileSizeWords(TUNE_FILE_MAX_BYTES)}.` });
      setBusy(false);
      return;
    }
    try {
      const res = await fetch(`/api/jobs/${workOrderId}/tunes`, { method: "POST", body: data });
      const json = (await res.json().catch(() => ({}))) as Partial<ErrorBody> & { sha256?: string };
      if (res.ok) {
        form.reset();
        setMessage({ ok: true, text: `Tune saved; SHA-256 ${json.sha256 ?? ""}.` });
        router.refresh();
      } else {
        const byField: Record<string, string> = {};
        for (const i of json.issues ?? []) byField[i.path] ??= i.message;
        setErrors(byField);
        setMessage({ ok: false, text: `${json.error ?? "The tune was not saved."} Nothing was saved.` });
      }
    } catch {
      setMessage({ ok: false, text: "No connection to the server: the tune was not saved. Try again." });
    } finally {
      setBusy(false);
    }
  }

  return (
    <section aria-labelledby="tunes-heading" className="flex flex-col gap-3" data-testid="tune-versions">
      <h2 id="tunes-heading" className="text-2xl font-bold">
        Tunes loaded on this bike
      </h2>
      {tunes.length === 0 ? (
        <p className="text-lg">No tune file recorded yet.</p>
      ) : (
        <ul className="flex flex-col gap-3">
          {[...tunes].reverse().map((t) => (
            <li key={t.id} className="rounded-lg border-2 border-steel-300 bg-white p-3 text-lg" data-testid="tune-version">
              <p className="flex flex-wrap items-baseline gap-x-3">
                <strong>{t.label}</strong>
                {t.id === newest?.id && (
                  <span className="rounded bg-ink px-2 text-base font-bold text-white">✓ newest: the one handed over</span>
                )}
                <span className="text-base">
                  {t.fileName}, {fileSizeWords(t.sizeBytes)} · {t.uploadedBy}, {formatDayTime(t.uploadedAt)}
                </span>
              </p>
              <p className="font-mono text-base break-all" data-testid="tune-hash">
                SHA-256 {groupedHash(t.sha256)}
              </p>
              {t.notes && <p className="text-base text-steel-700">{t.notes}</p>}
              <a
                href={`/api/jobs/${workOrderId}/tunes/${t.id}/file`}
                download
                className="mt-2 inline-flex min-h-target items-center underline"
              >
                Download the file
              </a>
            </li>
          ))}
        </ul>
      )}
      <details className="rounded-lg border-2 border-steel-700 bg-white p-3">
        <summary className="flex min-h-target cursor-pointer items-center text-lg font-bold">Upload a tune version</summary>
        <form
          className="mt-3 grid gap-4 md:grid-cols-3"
          noValidate
          onSubmit={(e) => {
            e.preventDefault();
            void upload(e.currentTarget);
          }}
        >
          <label className="flex flex-col gap-1 text-base font-bold">
            Tune file (any file, at most {fileSizeWords(TUNE_FILE_MAX_BYTES)})
            <input name="file" type="file" className="min-h-target text-lg" data-testid="tune-file" />
            {errors.file && <span className="rounded bg-fail-light px-2 py-1 font-bold text-fail">✕ {errors.file}</span>}
          </label>
          <label className="flex flex-col gap-1 text-base font-bold">
            Version label
            <input name="label" className={input} placeholder="e.g. v3 10 psi, E10" />
            {errors.label && <span className="rounded bg-fail-light px-2 py-1 font-bold text-fail">✕ {errors.label}</span>}
          </label>
          <label className="flex flex-col gap-1 text-base font-bold">
            Notes (what changed)
            <textarea name="notes" rows={2} className={`${input} py-2`} />
            {errors.notes && <span className="rounded bg-fail-light px-2 py-1 font-bold text-fail">✕ {errors.notes}</span>}
          </label>
          <div className="flex flex-wrap items-center gap-4 md:col-span-3">
            <button
              type="submit"
              disabled={busy}
              className="min-h-target rounded-xl bg-signal px-8 text-xl font-bold text-ink disabled:opacity-60"
            >
              {busy ? "Uploading…" : "Upload tune"}
            </button>
            <FormStatus message={message} testId="tune-message" />
          </div>
        </form>
      </details>
    </section>
  );
}
