"use client";

import { useState } from "react";
import { stepWithSerial, type PartView, type StepView, type WorkOrderView } from "@/lib/work-order-record";
import { recordOperation } from "@/lib/client/bench-store";
import { MAX_PART_QUANTITY, PART_TEXT_LIMITS, partFittedPayload } from "@/lib/sync/operations";
import type { JobSnapshot } from "@/lib/sync/snapshot";
import { useAuthor, useBench } from "./bench-context";
import { BigButton } from "./big-button";
import { useTapGuard } from "./use-tap-guard";
import { WithdrawEntry } from "./withdraw-entry";

type TextField = "partNumber" | "description" | "serial" | "batch" | "supplier";
const EMPTY: Record<TextField, string> = { partNumber: "", description: "", serial: "", batch: "", supplier: "" };
const FIELDS: Array<{ key: TextField; label: string; code?: boolean }> = [
  { key: "partNumber", label: "Part number", code: true },
  { key: "description", label: "Description" },
  { key: "serial", label: "Serial number", code: true },
  { key: "batch", label: "Batch number", code: true },
  { key: "supplier", label: "Supplier (optional)" },
];

/**
 * The parts that went in at this step (on record and waiting to send), and a form, closed until
 * asked for, to record one more: part number, description, serial and/or batch number, quantity.
 * Works offline: the part is an operation in the outbox until the next sync.
 */
export function PartsFittedPanel({
  jobId,
  view,
  job,
  people,
  held,
}: {
  jobId: string;
  view: StepView;
  job: WorkOrderView;
  people: JobSnapshot["people"];
  /** The step is on hold: nothing can be recorded on it. */
  held: boolean;
}) {
  const { db, syncNow } = useBench();
  const author = useAuthor();
  const [open, setOpen] = useState(false);
  const saveTap = useTapGuard();
  const [text, setText] = useState(EMPTY);
  const [quantity, setQuantity] = useState(1);
  const [errors, setErrors] = useState<Partial<Record<string, string>>>({});
  const [saved, setSaved] = useState<string | null>(null);
  const hasSerial = text.serial.trim() !== "";
  // Parts the office recorded name no bench user.
  const whoFitted = (id: string | null) => {
    const name = people.find((p) => p.id === id)?.name;
    return name ? `fitted by ${name}` : "recorded in the office";
  };

  async function save() {
    const optional = (k: TextField) => (text[k].trim() ? { [k]: text[k] } : {});
    const parsed = partFittedPayload.safeParse({
      partFittedId: crypto.randomUUID(),
      stepId: view.step.id,
      partNumber: text.partNumber,
      description: text.description,
      quantity: hasSerial ? 1 : quantity,
      ...optional("serial"),
      ...optional("batch"),
      ...optional("supplier"),
    });
    if (!parsed.success) {
      setErrors(Object.fromEntries(parsed.error.issues.map((i) => [String(i.path[0] ?? ""), i.message])));
      setSaved(null);
      return;
    }
    const p = parsed.data;
    const repeat = p.serial === undefined ? null : stepWithSerial(job, p.partNumber, p.serial);
    await recordOperation(db, author, jobId, "part.fitted", p);
    setSaved(
      `${p.quantity} × ${p.partNumber} saved${p.serial ? `, serial ${p.serial}` : ""}${p.batch ? `, batch ${p.batch}` : ""}.` +
        (repeat ? ` That serial number is already recorded at "${repeat.step.title}": the supervisor will be asked to check it.` : ""),
    );
    setErrors({});
    setText(EMPTY);
    setQuantity(1);
    setOpen(false);
    syncNow();
  }

  return (
    <section aria-labelledby={`parts-${view.step.id}`} className="rounded-xl border-4 border-steel-700 bg-white p-4">
      <h3 id={`parts-${view.step.id}`} className="text-2xl font-bold">
        Parts fitted here
      </h3>
      {view.parts.length === 0 ? (
        <p className="text-lg">No parts recorded at this step.</p>
      ) : (
        <ul className="mt-2 flex flex-col gap-2">
          {view.parts.map((p) => (
            <PartLine key={p.id} jobId={jobId} part={p} who={whoFitted(p.fittedBy)} />
          ))}
        </ul>
      )}
      {saved && (
        <p role="status" className="mt-2 text-lg font-bold">
          {saved}
        </p>
      )}
      {!open ? (
        <BigButton tone="plain" className="mt-3" aria-expanded={false} disabled={held} onClick={() => setOpen(true)}>
          {held ? "On hold: recording parts is off" : "Record a part fitted here"}
        </BigButton>
      ) : (
        <form
          className="mt-3 flex flex-col gap-3"
          noValidate
          onSubmit={(e) => {
            e.preventDefault();
            // one part per deliberate press of Save (a double tap, or Enter twice, records once)
            void saveTap.tap(save);
          }}
        >
          <div className="grid gap-3 md:grid-cols-2">
            {FIELDS.map((f) => (
              <label key={f.key} className="flex flex-col gap-1 text-lg font-bold">
                {f.label}
                <input
                  value={text[f.key]}
                  onChange={(e) => setText((t) => ({ ...t, [f.key]: e.target.value }))}
                  maxLength={PART_TEXT_LIMITS[f.key]}
                  autoComplete="off"
                  spellCheck={false}
                  autoCapitalize={f.code ? "characters" : "sentences"}
                  aria-invalid={Boolean(errors[f.key])}
                  aria-describedby={errors[f.key] ? `part-${f.key}-error` : undefined}
                  className={`min-h-target rounded-lg border-2 px-3 text-xl font-normal ${f.code ? "font-mono" : ""} ${errors[f.key] ? "border-fail" : "border-steel-700"}`}
                />
                {errors[f.key] && (
                  <span id={`part-${f.key}-error`} className="font-bold text-fail">
                    ✖ {errors[f.key]}
                  </span>
                )}
              </label>
            ))}
          </div>
          <div className="flex flex-wrap items-center gap-4" role="group" aria-label="Quantity">
            <span className="text-lg font-bold">Quantity</span>
            <BigButton
              tone="plain"
              aria-label="One fewer"
              disabled={hasSerial || quantity <= 1}
              onClick={() => setQuantity((q) => Math.max(1, q - 1))}
            >
              −
            </BigButton>
            <output className="min-w-target text-center font-mono text-3xl font-bold" data-testid="part-quantity" aria-live="polite">
              {hasSerial ? 1 : quantity}
            </output>
            <BigButton
              tone="plain"
              aria-label="One more"
              disabled={hasSerial || quantity >= MAX_PART_QUANTITY}
              onClick={() => setQuantity((q) => Math.min(MAX_PART_QUANTITY, q + 1))}
            >
              +
            </BigButton>
            {hasSerial && <span className="text-lg">One serial number, one part.</span>}
          </div>
          {errors.quantity && <p className="font-bold text-fail">✖ {errors.quantity}</p>}
          <p className="text-lg">Give the serial number, the batch number, or both.</p>
          <div className="flex flex-wrap gap-4">
            <BigButton tone="go" type="submit" disabled={held}>
              Save part
            </BigButton>
            <BigButton
              tone="plain"
              onClick={() => {
                setOpen(false);
                setErrors({});
              }}
            >
              Cancel
            </BigButton>
          </div>
        </form>
      )}
    </section>
  );
}

function PartLine({ jobId, part, who }: { jobId: string; part: PartView; who: string }) {
  return (
    <li data-testid="step-part" className="rounded-lg border-2 border-steel-300 p-3 text-lg">
      <span className={part.withdrawn ? "line-through" : "font-bold"}>
        {part.quantity} × <span className="font-mono">{part.partNumber}</span> {part.description}
      </span>
      <span className="block">
        {part.serial && <span className="font-mono">serial {part.serial} · </span>}
        {part.batch && <span className="font-mono">batch {part.batch} · </span>}
        {part.supplier && <span>{part.supplier} · </span>}
        {who} · {part.pending ? "⏳ waiting to send" : "✔ on record"}
      </span>
      {part.flagReason && <span className="block font-bold text-warn">⚑ Flagged for the supervisor: {part.flagReason}</span>}
      {part.withdrawn ? (
        <span className="block font-bold text-fail">
          ⊘ Withdrawn: “{part.withdrawn.reason}”{part.withdrawn.pending ? " (waiting to send)" : ""} — no longer counted as fitted
        </span>
      ) : (
        <span className="mt-2 block">
          <WithdrawEntry jobId={jobId} operationId={part.operationId} recordedBy={part.fittedBy} what={`part ${part.partNumber}`} />
        </span>
      )}
    </li>
  );
}
