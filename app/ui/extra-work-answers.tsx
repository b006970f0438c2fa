"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { api, type Wire } from "@/app/ui/api-client";
import { buttonClass, FormMessage, inputClass } from "@/app/ui/form-field";
import { qty, SupplementLines } from "@/app/ui/supplement-lines";
import type { SupplementView } from "@/db/office/supplements";
import { formatMinor } from "@/lib/money/quote-totals";

type Answer = { decision: "approved" | "declined" | null; comment: string };

/**
 * The customer's answer to extra work: approve or decline each line, with a comment if they like.
 * Signed in it posts to their own route; from the e-mailed link it posts the link's token.
 */
export function ExtraWorkAnswers({
  supplement,
  currency,
  photoBase,
  submit,
}: {
  supplement: Wire<SupplementView>;
  currency: string;
  /** Where the finding's photos are served, the photo id appended (null: not shown). */
  photoBase: string | null;
  submit: { url: string; token?: string };
}) {
  const router = useRouter();
  const open = supplement.lines.filter((l) => !l.answer);
  const [answers, setAnswers] = useState<Record<string, Answer>>({});
  const [busy, setBusy] = useState(false);
  const [message, setMessage] = useState<{ error?: string; ok?: string }>({});
  const set = (id: string, patch: Partial<Answer>) =>
    setAnswers((a) => ({ ...a, [id]: { ...(a[id] ?? { decision: null, comment: "" }), ...patch } }));

  async function send() {
    const missing = open.filter((l) => !answers[l.id]?.decision);
    if (missing.length) {
      setMessage({ error: `Approve or decline every line: ${missing.map((l) => l.description).join(", ")} still need an answer.` });
      return;
    }
    setBusy(true);
    setMessage({});
    try {
      await api("POST", submit.url, {
        ...(submit.token ? { token: submit.token } : {}),
        decisions: open.map((l) => ({ lineId: l.id, decision: answers[l.id].decision, comment: answers[l.id].comment })),
      });
      setMessage({ ok: "Thank you — your answers are with the workshop." });
      router.refresh();
    } catch (e) {
      setMessage({ error: (e as Error).message });
    } finally {
      setBusy(false);
    }
  }

  return (
    <div className="mt-3 rounded-lg border-2 border-steel-300 p-3" data-testid="customer-extra-work">
      <h3 className="text-xl font-bold">Extra work {supplement.number}: what we found</h3>
      <p className="mt-1 text-lg whitespace-pre-wrap">{supplement.finding}</p>
      {photoBase && supplement.photos.length > 0 && (
        <div className="mt-2 flex flex-wrap gap-4">
          {supplement.photos.map((p) => (
            <a key={p.id} href={`${photoBase}${p.id}`} target="_blank" rel="noreferrer">
              {/* eslint-disable-next-line @next/next/no-img-element -- a stored photo behind a session */}
              <img
                src={`${photoBase}${p.id}`}
                alt={p.caption || "Photo of the finding"}
                className="h-28 rounded-lg border-2 border-steel-300"
              />
            </a>
          ))}
        </div>
      )}
      <SupplementLines supplement={supplement} currency={currency} />
      {open.length > 0 && (
        <div className="mt-3 flex flex-col gap-4">
          {open.map((l) => (
            <fieldset key={l.id} className="rounded-lg border-2 border-steel-700 p-3" data-testid="answer-line">
              <legend className="px-1 text-lg font-bold">
                {l.description} — {qty(l.quantityHundredths)}
                {l.kind === "labour" ? " h" : ""} × {formatMinor(Number(l.unitPriceMinor), currency)}
              </legend>
              <div className="flex flex-wrap gap-4">
                {(["approved", "declined"] as const).map((d) => (
                  <label key={d} className="flex min-h-16 items-center gap-3 rounded-lg border-2 border-steel-300 px-4 text-lg font-bold">
                    <input
                      type="radio"
                      className="h-7 w-7"
                      name={`answer-${l.id}`}
                      checked={answers[l.id]?.decision === d}
                      onChange={() => set(l.id, { decision: d })}
                    />
                    {d === "approved" ? "✔ Approve" : "✖ Decline"}
                  </label>
                ))}
                <label className="flex grow flex-col gap-1 text-base font-bold">
                  Comment (optional)
                  <input
                    className={inputClass}
                    value={answers[l.id]?.comment ?? ""}
                    onChange={(e) => set(l.id, { comment: e.target.value })}
                  />
                </label>
              </div>
            </fieldset>
          ))}
          <button type="button" className={`${buttonClass} self-start`} disabled={busy} onClick={() => void send()}>
            Send my answers
          </button>
        </div>
      )}
      <div className="mt-2">
        <FormMessage error={message.error} ok={message.ok} />
      </div>
    </div>
  );
}
