"use client";

import { useRouter } from "next/navigation";
import { useState, type FormEvent } from "react";
import { api, ApiError, type FieldIssue } from "@/app/ui/api-client";
import { buttonClass, FormMessage, inputClass, quietButtonClass } from "@/app/ui/form-field";

interface Line {
  key: number;
  partNumber: string;
  description: string;
  location: string;
  batch: string;
  serial: string;
  quantity: string;
  lowStockAt: string;
}

const blank = (key: number): Line => ({
  key,
  partNumber: "",
  description: "",
  location: "",
  batch: "",
  serial: "",
  quantity: "1",
  lowStockAt: "",
});

const COLUMNS: Array<{ field: Exclude<keyof Line, "key">; label: string; width: string; mono?: boolean }> = [
  { field: "partNumber", label: "Part number", width: "w-36", mono: true },
  { field: "description", label: "Description", width: "w-48" },
  { field: "location", label: "Shelf", width: "w-24" },
  { field: "batch", label: "Batch number", width: "w-32", mono: true },
  { field: "serial", label: "Serial number", width: "w-32", mono: true },
  { field: "quantity", label: "Quantity", width: "w-20" },
  { field: "lowStockAt", label: "Low-stock level", width: "w-32" },
];

/** A number as typed ("" left out; anything else sent as a number, so the server names a bad one). */
const asNumber = (s: string) => (s.trim() === "" ? undefined : Number(s));
const asText = (s: string) => (s.trim() === "" ? undefined : s);

// Receiving a delivery: the supplier, the delivery note and one line per batch or serial-numbered
// part. The server takes all the lines or none; each refused line shows its reason beside it.
export function ReceiveForm() {
  const router = useRouter();
  const [supplier, setSupplier] = useState("");
  const [reference, setReference] = useState("");
  const [lines, setLines] = useState<Line[]>([blank(0)]);
  const [error, setError] = useState<string | null>(null);
  const [issues, setIssues] = useState<FieldIssue[]>([]);
  const [ok, setOk] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const issueAt = (path: string) => issues.find((i) => i.path === path)?.message;
  const set = (key: number, field: keyof Line, value: string) =>
    setLines((ls) => ls.map((l) => (l.key === key ? { ...l, [field]: value } : l)));

  async function onSubmit(e: FormEvent) {
    e.preventDefault();
    setBusy(true);
    setError(null);
    setIssues([]);
    setOk(null);
    try {
      await api("POST", "/api/office/stock/deliveries", {
        supplier,
        reference,
        lines: lines.map((l) => ({
          partNumber: l.partNumber,
          description: l.description,
          location: l.location,
          batch: asText(l.batch),
          serial: asText(l.serial),
          quantity: asNumber(l.quantity),
          lowStockAt: asNumber(l.lowStockAt),
        })),
      });
      setOk(`Received: ${lines.length} line${lines.length === 1 ? "" : "s"} from ${supplier.trim()} put on the shelf.`);
      setLines([blank(Date.now())]);
      setReference("");
      router.refresh();
    } catch (err) {
      setError((err as Error).message);
      if (err instanceof ApiError) setIssues(err.issues);
    } finally {
      setBusy(false);
    }
  }

  return (
    <form noValidate onSubmit={onSubmit} className="mt-3 flex flex-col gap-4" aria-label="Receive a delivery">
      <div className="flex flex-wrap gap-4">
        <label className="flex flex-col gap-1 font-bold">
          Supplier
          <input
            name="supplier"
            value={supplier}
            onChange={(e) => setSupplier(e.target.value)}
            className={`${inputClass} w-64 font-normal`}
          />
          {issueAt("supplier") && <span className="font-bold text-fail">✖ {issueAt("supplier")}</span>}
        </label>
        <label className="flex flex-col gap-1 font-bold">
          Delivery note
          <input
            name="reference"
            value={reference}
            onChange={(e) => setReference(e.target.value)}
            className={`${inputClass} w-48 font-normal`}
          />
        </label>
      </div>
      {lines.map((l, i) => (
        <fieldset key={l.key} className="rounded-lg border-2 border-steel-300 px-3 pb-3" data-testid={`delivery-line-${i}`}>
          <legend className="px-1 text-base font-bold">Line {i + 1}</legend>
          <div className="flex flex-wrap items-start gap-x-3 gap-y-2">
            {COLUMNS.map((c) => {
              const problem = issueAt(`lines.${i}.${c.field}`);
              return (
                <label key={c.field} className="flex flex-col gap-1 text-base font-bold">
                  {c.label}
                  <input
                    aria-label={`${c.label}, line ${i + 1}`}
                    aria-invalid={problem ? true : undefined}
                    inputMode={c.field === "quantity" || c.field === "lowStockAt" ? "numeric" : undefined}
                    value={l[c.field]}
                    onChange={(e) => set(l.key, c.field, e.target.value)}
                    className={`${inputClass} ${c.width} font-normal ${c.mono ? "font-mono" : ""}`}
                  />
                  {problem && <span className="max-w-64 font-bold text-fail">✖ {problem}</span>}
                </label>
              );
            })}
            {lines.length > 1 && (
              <button
                type="button"
                className={`${quietButtonClass} self-end`}
                onClick={() => setLines((ls) => ls.filter((x) => x.key !== l.key))}
              >
                Remove line {i + 1}
              </button>
            )}
          </div>
        </fieldset>
      ))}
      <div className="flex flex-wrap gap-4">
        <button type="button" className={quietButtonClass} onClick={() => setLines((ls) => [...ls, blank(Date.now())])}>
          Add a line
        </button>
        <button type="submit" disabled={busy} className={buttonClass}>
          Receive delivery
        </button>
      </div>
      <FormMessage error={error} ok={ok} />
    </form>
  );
}
