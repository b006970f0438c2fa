"use client";

import Papa from "papaparse";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { columnMappingSchema, MAPPING_TARGETS, targetLabel, targetUnits, type ColumnMapping, type MappingTarget } from "@/lib/dyno";
import type { ErrorBody } from "@/lib/errors";
import { FormStatus, type FormOutcome } from "./form-status";

/** One row of the mapping step: a file column, what it holds (null: not used) and its unit. */
export interface MappingRow {
  column: string;
  channel: MappingTarget | null;
  unit: string;
}

/** A mapping the shop saved by name (GET /api/presets/dyno-csv-mapping). */
export interface SavedMapping {
  id: string;
  name: string;
  body: unknown;
}

const select = "min-h-14 w-full rounded-lg border-2 border-steel-700 bg-white px-2 text-lg";

/** The file's header and first lines, read in the browser to offer the columns. */
export function previewOf(text: string): { header: string[]; rows: string[][] } {
  const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ""), {
    preview: 4,
    skipEmptyLines: true,
    delimitersToGuess: [",", ";", "\t"],
  });
  const [header = [], ...rows] = parsed.data;
  return { header: header.map((h) => h.trim()), rows };
}

/** The mapping as our format, from the rows the user set (columns marked "not used" left out). */
export function mappingOf(rows: readonly MappingRow[]): ColumnMapping {
  return {
    format: "benchtag-dyno-mapping",
    formatVersion: 1,
    columns: rows.flatMap((r) => (r.channel ? [{ column: r.column, channel: r.channel, unit: r.unit }] : [])),
  };
}

/** Applies a saved mapping to this file's columns (by name, any letter case); other columns: not used. */
export function applySaved(header: readonly string[], saved: unknown): MappingRow[] {
  const parsed = columnMappingSchema.safeParse(saved);
  const columns = parsed.success ? parsed.data.columns : [];
  return header.map((column) => {
    const hit = columns.find((c) => c.column.toLowerCase() === column.toLowerCase());
    return hit ? { column, channel: hit.channel, unit: hit.unit } : { column, channel: null, unit: "" };
  });
}

// The mapping step of a logged file: for each column of the file, what it holds and in which unit;
// a saved mapping can be applied, and this one saved for the shop under a name.
export function ColumnMappingStep({
  header,
  preview,
  rows,
  onChange,
  mappings,
}: {
  header: string[];
  preview: string[][];
  rows: MappingRow[];
  onChange: (rows: MappingRow[]) => void;
  mappings: SavedMapping[];
}) {
  const router = useRouter();
  const [name, setName] = useState("");
  const [message, setMessage] = useState<FormOutcome | null>(null);
  const set = (i: number, patch: Partial<MappingRow>) => onChange(rows.map((r, j) => (j === i ? { ...r, ...patch } : r)));

  async function save() {
    setMessage(null);
    const res = await fetch("/api/presets/dyno-csv-mapping", {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ name, body: mappingOf(rows) }),
    }).catch(() => null);
    if (!res) return setMessage({ ok: false, text: "No connection to the server: the mapping was not saved." });
    const json = (await res.json().catch(() => ({}))) as Partial<ErrorBody>;
    if (res.ok) {
      setMessage({ ok: true, text: `Mapping “${name.trim()}” saved for the shop.` });
      router.refresh();
    } else {
      setMessage({ ok: false, text: [json.error, ...(json.issues ?? []).map((i) => i.message)].filter(Boolean).join(" ") });
    }
  }

  return (
    <div className="flex flex-col gap-4 rounded-lg border-2 border-steel-300 p-3" data-testid="mapping-step">
      <p className="text-lg font-bold">Which column is which</p>
      {mappings.length > 0 && (
        <label className="flex max-w-md flex-col gap-1 text-base font-bold">
          Use a saved mapping
          <select
            className={select}
            defaultValue=""
            onChange={(e) => {
              const m = mappings.find((x) => x.id === e.currentTarget.value);
              if (m) onChange(applySaved(header, m.body));
            }}
          >
            <option value="">— choose —</option>
            {mappings.map((m) => (
              <option key={m.id} value={m.id}>
                {m.name}
              </option>
            ))}
          </select>
        </label>
      )}
      <div className="overflow-x-auto">
        <table className="w-full border-collapse text-left text-lg">
          <thead>
            <tr className="border-b-2 border-steel-700">
              <th className="py-2 pr-3">File column</th>
              <th className="py-2 pr-3">First values</th>
              <th className="py-2 pr-3">Holds</th>
              <th className="py-2 pr-3">Unit</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r, i) => (
              <tr key={r.column + i} className="border-b border-steel-300 align-top">
                <td className="py-2 pr-3 font-mono">{r.column || "(no name)"}</td>
                <td className="py-2 pr-3 font-mono text-base">{preview.map((p) => p[header.indexOf(r.column)] ?? "").join(", ")}</td>
                <td className="py-2 pr-3">
                  <select
                    aria-label={`Column ${r.column} holds`}
                    className={select}
                    value={r.channel ?? ""}
                    onChange={(e) => {
                      const channel = MAPPING_TARGETS.find((t) => t === e.currentTarget.value) ?? null;
                      set(i, { channel, unit: channel ? targetUnits(channel)[0] : "" });
                    }}
                  >
                    <option value="">Not used</option>
                    {MAPPING_TARGETS.map((t) => (
                      <option key={t} value={t}>
                        {targetLabel(t)}
                      </option>
                    ))}
                  </select>
                </td>
                <td className="py-2 pr-3">
                  {r.channel && (
                    <select
                      aria-label={`Column ${r.column} unit`}
                      className={select}
                      value={r.unit}
                      onChange={(e) => set(i, { unit: e.currentTarget.value })}
                    >
                      {targetUnits(r.channel).map((u) => (
                        <option key={u} value={u}>
                          {u}
                        </option>
                      ))}
                    </select>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <div className="flex flex-wrap items-end gap-4">
        <label className="flex flex-col gap-1 text-base font-bold">
          Save this mapping for the shop as
          <input
            value={name}
            onChange={(e) => setName(e.currentTarget.value)}
            className={`${select} w-72`}
            placeholder="e.g. Bay 2 logger"
          />
        </label>
        <button
          type="button"
          onClick={() => void save()}
          className="min-h-target rounded-lg border-2 border-ink bg-white px-5 text-lg font-bold"
        >
          Save mapping
        </button>
        <FormStatus message={message} />
      </div>
    </div>
  );
}
