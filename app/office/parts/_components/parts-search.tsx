"use client";

import { useQuery } from "@tanstack/react-query";
import Link from "next/link";
import { useState, type FormEvent } from "react";
import { api } from "@/app/ui/api-client";
import { formatDay } from "@/lib/format/dates";
import { buttonClass, inputClass } from "@/app/ui/form-field";

interface Fitting {
  id: string;
  partNumber: string;
  description: string;
  supplier: string;
  serial: string | null;
  batch: string | null;
  fittedAt: string;
  workOrderId: string;
  workOrderNumber: number;
  bikeId: string;
  tagCode: string;
  make: string;
  model: string;
  customerName: string;
}

// "Which bikes got batch X?" — for recalls and supplier warnings.
export function PartsSearch() {
  const [field, setField] = useState("batch");
  const [code, setCode] = useState("");
  const [asked, setAsked] = useState<{ field: string; code: string } | null>(null);
  const q = useQuery({
    queryKey: ["parts", asked],
    enabled: Boolean(asked),
    queryFn: () =>
      api<{ fittings: Fitting[] }>("GET", `/api/office/parts?${new URLSearchParams({ field: asked!.field, code: asked!.code })}`),
  });
  function onSubmit(e: FormEvent) {
    e.preventDefault();
    if (code.trim()) setAsked({ field, code: code.trim() });
  }
  const bikes = new Set(q.data?.fittings.map((f) => f.bikeId));
  return (
    <div>
      <form onSubmit={onSubmit} className="mt-4 flex flex-wrap items-end gap-3">
        <label className="flex flex-col gap-1 font-bold">
          Look up by
          <select value={field} onChange={(e) => setField(e.target.value)} className={`${inputClass} font-normal`}>
            <option value="batch">Batch</option>
            <option value="serial">Serial number</option>
            <option value="part_number">Part number</option>
          </select>
        </label>
        <label className="flex flex-col gap-1 font-bold">
          Code
          <input value={code} onChange={(e) => setCode(e.target.value)} className={`${inputClass} w-64 font-mono font-normal`} />
        </label>
        <button type="submit" className={buttonClass}>
          Find bikes
        </button>
      </form>
      {q.isError && (
        <p role="alert" className="mt-3 font-bold text-fail">
          {(q.error as Error).message}
        </p>
      )}
      {q.data && (
        <div className="mt-6" data-testid="parts-results">
          <p className="text-lg font-bold">
            {bikes.size} bike{bikes.size === 1 ? "" : "s"}, {q.data.fittings.length} fitting{q.data.fittings.length === 1 ? "" : "s"} for{" "}
            {asked!.field.replace("_", " ")} “{asked!.code}”
          </p>
          <table className="mt-2 w-full border-collapse text-left">
            <thead>
              <tr className="border-b-2 border-steel-700">
                <th className="pr-3">Tag</th>
                <th className="pr-3">Bike</th>
                <th className="pr-3">Owner</th>
                <th className="pr-3">Job</th>
                <th className="pr-3">Part</th>
                <th className="pr-3">Serial / batch</th>
                <th className="pr-3">Fitted</th>
              </tr>
            </thead>
            <tbody>
              {q.data.fittings.map((f) => (
                <tr key={f.id} className="border-b border-steel-300">
                  <td className="py-1 pr-3 font-mono">
                    <Link className="underline" href={`/office/bikes/${f.bikeId}`}>
                      {f.tagCode}
                    </Link>
                  </td>
                  <td className="py-1 pr-3">
                    {f.make} {f.model}
                  </td>
                  <td className="py-1 pr-3">{f.customerName}</td>
                  <td className="py-1 pr-3 font-mono">
                    <Link className="underline" href={`/office/work-orders/${f.workOrderId}`}>
                      #{f.workOrderNumber}
                    </Link>
                  </td>
                  <td className="py-1 pr-3">
                    <span className="font-mono">{f.partNumber}</span> {f.description} {f.supplier && `(${f.supplier})`}
                  </td>
                  <td className="py-1 pr-3 font-mono">{[f.serial, f.batch].filter(Boolean).join(" · ")}</td>
                  <td className="py-1 pr-3">{formatDay(f.fittedAt)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </div>
  );
}
