/**
 * A column mapping for a logged dyno file (README, "Logged run CSV and its column mapping"): which of
 * the file's columns is engine speed, which is torque and which are logged channels, each with the
 * unit the file writes it in. Columns the mapping does not name are not used. A shop saves mappings
 * by name (one per logger) and applies them to the next file of the same logger.
 *
 * Our own format:
 *   { "format": "benchtag-dyno-mapping", "formatVersion": 1,
 *     "columns": [ { "column": "RPM", "channel": "rpm", "unit": "rpm" },
 *                  { "column": "Torque", "channel": "torque", "unit": "N·m" },
 *                  { "column": "AFR 1", "channel": "mixture", "unit": "AFR" } ] }
 */
import { z } from "zod";
import { textProblem } from "@/lib/safe-values";
import { CHANNEL_IDS, CHANNELS, channelUnitIds, type ChannelId } from "./channels";
import { CURVE_TORQUE_UNITS } from "./curve-rows";

/** What a file column may be mapped to: engine speed, torque, or a logged channel. */
export const MAPPING_TARGETS = ["rpm", "torque", ...CHANNEL_IDS] as const;
export type MappingTarget = (typeof MAPPING_TARGETS)[number];

/** The name the user sees for each target. */
export function targetLabel(target: MappingTarget): string {
  if (target === "rpm") return "Engine speed";
  if (target === "torque") return "Torque";
  return CHANNELS[target].label;
}

/** The units a target may be given in. */
export function targetUnits(target: MappingTarget): readonly string[] {
  if (target === "rpm") return ["rpm"];
  if (target === "torque") return CURVE_TORQUE_UNITS;
  return channelUnitIds(target);
}

export function isChannel(target: MappingTarget): target is ChannelId {
  return target !== "rpm" && target !== "torque";
}

const columnName = z
  .string({ error: "Name the file's column." })
  .trim()
  .min(1, "Name the file's column.")
  .max(120, "Column name: at most 120 characters.")
  .superRefine((s, ctx) => {
    const problem = textProblem(s, { label: "Column name" });
    if (problem) ctx.addIssue({ code: "custom", message: problem });
  });

const mappedColumn = z
  .object({
    column: columnName,
    channel: z.enum(MAPPING_TARGETS, { error: `Choose what the column holds: ${MAPPING_TARGETS.map(targetLabel).join(", ")}.` }),
    unit: z.string({ error: "Choose the column's unit." }),
  })
  .strict()
  .superRefine((c, ctx) => {
    const units = targetUnits(c.channel);
    if (!units.includes(c.unit)) {
      ctx.addIssue({
        code: "custom",
        path: ["unit"],
        message: `${targetLabel(c.channel)} (column "${c.column}"): choose the unit ${units.join(", ")}; got ${JSON.stringify(c.unit)}.`,
      });
    }
  });

export const columnMappingSchema = z
  .object({
    format: z.literal("benchtag-dyno-mapping", { error: 'Format must be "benchtag-dyno-mapping".' }),
    formatVersion: z.literal(1, { error: "Format version must be 1." }),
    columns: z.array(mappedColumn).min(2, "Map at least engine speed and torque.").max(40, "Map at most 40 columns."),
  })
  .strict()
  .superRefine((m, ctx) => {
    for (const target of ["rpm", "torque"] as const) {
      const n = m.columns.filter((c) => c.channel === target).length;
      if (n !== 1) {
        ctx.addIssue({
          code: "custom",
          path: ["columns"],
          message:
            n === 0
              ? `Choose the column that holds ${targetLabel(target).toLowerCase()}.`
              : `Only one column may hold ${targetLabel(target).toLowerCase()}.`,
        });
      }
    }
    const seenTarget = new Set<string>();
    const seenColumn = new Set<string>();
    m.columns.forEach((c, i) => {
      if (isChannel(c.channel) && seenTarget.has(c.channel)) {
        ctx.addIssue({
          code: "custom",
          path: ["columns", i, "channel"],
          message: `Only one column may hold ${targetLabel(c.channel).toLowerCase()}.`,
        });
      }
      seenTarget.add(c.channel);
      const key = c.column.toLowerCase();
      if (seenColumn.has(key)) {
        ctx.addIssue({ code: "custom", path: ["columns", i, "column"], message: `The column "${c.column}" is mapped twice.` });
      }
      seenColumn.add(key);
    });
  });

export type ColumnMapping = z.output<typeof columnMappingSchema>;
export type MappedColumn = ColumnMapping["columns"][number];

/** A new mapping from a file's header: nothing chosen yet except what the names make obvious. */
export function guessMapping(header: readonly string[]): Array<{ column: string; channel: MappingTarget | null; unit: string }> {
  const taken = new Set<MappingTarget>();
  return header.map((column) => {
    const h = column.toLowerCase();
    const guess: [MappingTarget, string] | null = /\brpm\b|engine speed/.test(h)
      ? ["rpm", "rpm"]
      : /torque|\btq\b/.test(h)
        ? ["torque", /lb/.test(h) ? "lbf·ft" : "N·m"]
        : /lambda|\bλ\b/.test(h)
          ? ["mixture", "λ"]
          : /\bafr\b|air.?fuel/.test(h)
            ? ["mixture", "AFR"]
            : /boost|\bmap\b/.test(h)
              ? ["boost", /psi/.test(h) ? "psi" : /bar/.test(h) ? "bar" : "kPa"]
              : /knock/.test(h)
                ? ["knockRetard", "°"]
                : /ign|timing|advance/.test(h)
                  ? ["ignition", "° BTDC"]
                  : /gear/.test(h)
                    ? ["gear", "gear"]
                    : /speed|km\/h|mph/.test(h)
                      ? ["roadSpeed", /mph/.test(h) ? "mph" : "km/h"]
                      : null;
    if (!guess || taken.has(guess[0])) return { column, channel: null, unit: "" };
    taken.add(guess[0]);
    return { column, channel: guess[0], unit: guess[1] };
  });
}
