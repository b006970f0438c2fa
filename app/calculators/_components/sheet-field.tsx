"use client";

import { describeRange, requireQuantity, withUnit } from "@/lib/calc";
import { SHEET_FIELDS, type SheetField } from "@/lib/build-figures/build-sheet";
import { NumberField, readNumber } from "./number-field";

import type { SheetForm } from "./planner-fields";

export type { SheetForm };

/** A build sheet figure as a form field: the label, unit and range come from the one rule the server checks. */
export function SheetNumberField({
  field,
  form,
  set,
  idPrefix,
}: {
  field: SheetField;
  form: SheetForm;
  set: (f: SheetField, v: string) => void;
  idPrefix: string;
}) {
  const rule = SHEET_FIELDS[field];
  return (
    <NumberField
      id={`${idPrefix}-${field}`}
      label={rule.label}
      unit={rule.unit || "ratio"}
      value={form[field] ?? ""}
      onChange={(v) => set(field, v)}
      hint={`Range: ${describeRange({ ...rule, hint: undefined })}`}
    />
  );
}

/** The figure typed in `field`, checked against its range; throws the message in workshop words naming the field. */
export function readSheetField(form: SheetForm, field: SheetField): number {
  const rule = SHEET_FIELDS[field];
  const text = form[field] ?? "";
  if (text.trim() === "") throw new Error(`${rule.label}: enter a figure${rule.unit ? ` in ${rule.unit}` : ""}.`);
  return requireQuantity(rule, readNumber(rule.label, text), field);
}

/** The figures typed (blank ones left out) for saving; the server checks them again. */
export function sheetFigures(form: SheetForm): Partial<Record<SheetField, number | string>> {
  const out: Partial<Record<SheetField, number | string>> = {};
  for (const [k, v] of Object.entries(form) as Array<[SheetField, string | undefined]>) {
    if (v === undefined || v.trim() === "") continue;
    const t = v.trim().replace(",", ".");
    out[k] = /^-?\d+(\.\d+)?$/.test(t) ? Number(t) : v;
  }
  return out;
}

export const kpaText = (x: number) => withUnit(Number(x.toFixed(1)), "kPa");
