import { z } from "zod";
import { formatDay } from "../format/dates";
import { safeText } from "../safe-values";

// Come-backs: a handed-over bike back with a fault. Our own words for what the office finds.

export const COME_BACK_CAUSES = ["our_workmanship", "part_failed", "not_our_work", "nothing_found"] as const;
export type ComeBackCause = (typeof COME_BACK_CAUSES)[number];

export const CAUSE_LABELS: Record<ComeBackCause, string> = {
  our_workmanship: "Our workmanship",
  part_failed: "A part failed",
  not_our_work: "Not from our work",
  nothing_found: "Nothing found",
};

/** Longest rider's report and finding note (characters). */
export const COME_BACK_TEXT_MAX = 2000;

const odometer = z
  .number({ error: "Odometer must be a whole number of km." })
  .int("Odometer must be a whole number of km.")
  .min(0, "Odometer must be between 0 and 2,000,000 km.")
  .max(2_000_000, "Odometer must be between 0 and 2,000,000 km.");

/** Opening a come-back from a handed-over work order. */
export const openComeBackSchema = z
  .object({
    originalWorkOrderId: z.uuid({ error: "Choose the handed-over work order the bike came back from." }),
    riderReport: safeText({
      label: "What the rider reports",
      min: 3,
      max: COME_BACK_TEXT_MAX,
      multiline: true,
      tooShort: "Write down what the rider reports.",
    }),
    warrantyClaimed: z.boolean({ error: "Say whether the rider claims warranty." }),
    odometerKm: odometer,
  })
  .strict();
export type OpenComeBackInput = z.infer<typeof openComeBackSchema>;

/** A finding on a come-back (append-only; a later one replaces the one it names). */
export const comeBackFindingSchema = z
  .object({
    underWarranty: z.boolean({ error: "Say whether the work is done under warranty." }),
    cause: z.enum(COME_BACK_CAUSES, { error: "Choose what caused the come-back." }),
    note: safeText({ label: "What was found", min: 3, max: COME_BACK_TEXT_MAX, multiline: true, tooShort: "Write down what was found." }),
    replacesId: z.uuid({ error: "The finding to replace is not a valid id." }).nullable().optional(),
  })
  .strict();
export type ComeBackFindingInput = z.infer<typeof comeBackFindingSchema>;

/** What the bench says about a scanned bike whose last job was handed over. */
export function handedOverMessage(
  h: { number: number; tagCode: string; handedOverOn: string | null; canOpenComeBack: boolean },
  /** The calendar the day is said in; the device's own when absent. */
  timeZone?: string,
): string {
  // said on the tablet, whose clock keeps the shop's time
  const on = h.handedOverOn ? ` on ${formatDay(h.handedOverOn, timeZone)}` : "";
  const head = `Bike ${h.tagCode} was handed over${on} (job #${h.number}) and has no open job.`;
  if (h.canOpenComeBack) return `${head} If it is back with a fault, open a come-back linked to job #${h.number}.`;
  return `${head} If it is back with a fault, ask the office or a supervisor to open a come-back.`;
}
