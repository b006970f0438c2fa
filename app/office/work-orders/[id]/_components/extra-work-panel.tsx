"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { api, ApiError, type Wire } from "@/app/ui/api-client";
import { buttonClass, FormMessage, inputClass, quietButtonClass } from "@/app/ui/form-field";
import type { SupplementView } from "@/db/office/supplements";
import { formatDayTime } from "@/lib/format/dates";
import { parseHundredths } from "@/lib/money/quote-totals";
import { SupplementLines } from "@/app/ui/supplement-lines";

interface DraftLine {
  kind: "part" | "labour";
  description: string;
  partNumber: string;
  quantity: string;
  price: string;
}
const emptyLine = (): DraftLine => ({ kind: "part", description: "", partNumber: "", quantity: "1", price: "" });

/** The office's extra work on a job in build: what was written and answered, and a form for more. */
export function ExtraWorkPanel({
  workOrderId,
  mayWrite,
  why,
  supplements,
  photos,
  currency,
}: {
  workOrderId: string;
  mayWrite: boolean;
  why: string;
  supplements: Wire<SupplementView>[];
  photos: Array<{ id: string; caption: string }>;
  currency: string;
}) {
  const router = useRouter();
  const [finding, setFinding] = useState("");
  const [lines, setLines] = useState<DraftLine[]>([emptyLine()]);
  const [chosen, setChosen] = useState<string[]>([]);
  const [busy, setBusy] = useState(false);
  const [message, setMessage] = useState<{ error?: string; ok?: string }>({});

  const setLine = (i: number, patch: Partial<DraftLine>) => setLines((ls) => ls.map((l, j) => (j === i ? { ...l, ...patch } : l)));

  async function send() {
    setBusy(true);
    setMessage({});
    try {
      const body = {
        finding,
        photoIds: chosen,
        lines: lines.map((l) => ({
          kind: l.kind,
          description: l.description,
          partNumber: l.partNumber,
          quantityHundredths: parseHundredths(l.quantity),
          unitPriceMinor: parseHundredths(l.price),
        })),
      };
      const bad = lines.findIndex((l) => parseHundredths(l.quantity) === null || parseHundredths(l.price) === null);
      if (bad >= 0) throw new Error(`Line ${bad + 1}: quantity and unit price are numbers with at most two decimals, e.g. 1.5 and 42.50.`);
      const r = await api<{ number: number; mail: { ok: boolean } }>("POST", `/api/office/work-orders/${workOrderId}/supplements`, body);
      setMessage({
        ok: `Extra work ${r.number} sent to the customer${r.mail.ok ? " by e-mail" : " (no e-mail address on file: tell them)"}.`,
      });
      setFinding("");
      setLines([emptyLine()]);
      setChosen([]);
      router.refresh();
    } catch (e) {
      const issues = e instanceof ApiError ? e.issues.map((i) => i.message) : [];
      setMessage({ error: [(e as Error).message, ...issues.filter((m) => m !== (e as Error).message)].join(" ") });
    } finally {
      setBusy(false);
    }
  }

  return (
    <section className="mt-6 rounded-xl border-2 border-steel-700 bg-white p-5" data-testid="extra-work-panel">
      <h2 className="text-2xl font-bold">Extra work</h2>
      {supplements.length === 0 && <p className="mt-2 text-lg">No extra work written for this job.</p>}
      {supplements.map((s) => (
        <article key={s.id} className="mt-4 rounded-lg border-2 border-steel-300 p-4" data-testid="supplement">
          <h3 className="text-xl font-bold">
            Extra work {s.number} — {formatDayTime(s.createdAt)}, by {s.writtenBy ?? "the office"}
          </h3>
          <p className="mt-1 text-lg whitespace-pre-wrap">{s.finding}</p>
          {s.photos.length > 0 && (
            <div className="mt-2 flex flex-wrap gap-4">
              {s.photos.map((p) => (
                <a key={p.id} href={`/api/office/attachments/${p.id}`} target="_blank" rel="noreferrer">
                  {/* eslint-disable-next-line @next/next/no-img-element -- a stored photo behind a session */}
                  <img
                    src={`/api/office/attachments/${p.id}`}
                    alt={p.caption || "Photo of the finding"}
                    className="h-24 rounded-lg border-2 border-steel-300"
                  />
                </a>
              ))}
            </div>
          )}
          <SupplementLines supplement={s} currency={currency} />
        </article>
      ))}
      {mayWrite ? (
        <div className="mt-6 flex flex-col gap-4" data-testid="extra-work-form">
          <h3 className="text-xl font-bold">Write extra work for the customer</h3>
          <label className="flex flex-col gap-1 text-base font-bold">
            Finding (what was found, and why it needs the work)
            <textarea className={`${inputClass} min-h-24 py-2`} value={finding} onChange={(e) => setFinding(e.target.value)} />
          </label>
          {photos.length > 0 && (
            <fieldset className="flex flex-wrap gap-4">
              <legend className="text-base font-bold">Photos that show it</legend>
              {photos.map((p) => (
                <label key={p.id} className="flex min-h-16 items-center gap-3 rounded-lg border-2 border-steel-300 px-3">
                  <input
                    type="checkbox"
                    className="h-8 w-8"
                    checked={chosen.includes(p.id)}
                    onChange={(e) => setChosen((c) => (e.target.checked ? [...c, p.id] : c.filter((x) => x !== p.id)))}
                  />
                  {/* eslint-disable-next-line @next/next/no-img-element -- a stored photo behind a session */}
                  <img src={`/api/office/attachments/${p.id}`} alt="" className="h-14 rounded" />
                  {p.caption || "Photo"}
                </label>
              ))}
            </fieldset>
          )}
          {lines.map((l, i) => (
            <fieldset
              key={i}
              className="flex flex-wrap items-end gap-4 rounded-lg border-2 border-steel-300 p-3"
              data-testid="extra-work-line"
            >
              <legend className="text-base font-bold">Line {i + 1}</legend>
              <label className="flex flex-col gap-1 text-base font-bold">
                Kind
                <select className={inputClass} value={l.kind} onChange={(e) => setLine(i, { kind: e.target.value as DraftLine["kind"] })}>
                  <option value="part">Part</option>
                  <option value="labour">Labour (hours)</option>
                </select>
              </label>
              <label className="flex grow flex-col gap-1 text-base font-bold">
                Description
                <input className={inputClass} value={l.description} onChange={(e) => setLine(i, { description: e.target.value })} />
              </label>
              <label className="flex flex-col gap-1 text-base font-bold">
                Part number
                <input className={`${inputClass} w-40`} value={l.partNumber} onChange={(e) => setLine(i, { partNumber: e.target.value })} />
              </label>
              <label className="flex flex-col gap-1 text-base font-bold">
                {l.kind === "labour" ? "Hours" : "Quantity"}
                <input
                  className={`${inputClass} w-28`}
                  inputMode="decimal"
                  value={l.quantity}
                  onChange={(e) => setLine(i, { quantity: e.target.value })}
                />
              </label>
              <label className="flex flex-col gap-1 text-base font-bold">
                Unit price ({currency})
                <input
                  className={`${inputClass} w-36`}
                  inputMode="decimal"
                  value={l.price}
                  onChange={(e) => setLine(i, { price: e.target.value })}
                />
              </label>
              {lines.length > 1 && (
                <button type="button" className={quietButtonClass} onClick={() => setLines((ls) => ls.filter((_, j) => j !== i))}>
                  Remove line {i + 1}
                </button>
              )}
            </fieldset>
          ))}
          <div className="flex flex-wrap gap-4">
            <button type="button" className={quietButtonClass} onClick={() => setLines((ls) => [...ls, emptyLine()])}>
              Add a line
            </button>
            <button type="button" className={buttonClass} disabled={busy} onClick={() => void send()}>
              Send the extra work to the customer
            </button>
          </div>
        </div>
      ) : (
        <p className="mt-4 text-base text-steel-700">{why}</p>
      )}
      <div className="mt-3">
        <FormMessage error={message.error} ok={message.ok} />
      </div>
    </section>
  );
}
