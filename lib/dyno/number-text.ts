/**
 * A number typed as text (a form field, a CSV cell) or already a number, checked with zod:
 * "<label> is empty" / "<label> must be a number", then the range "<label> must be at least/most …".
 */
import { z } from "zod";

export function numberFromText(label: string, min: number, max: number, unit: string, opts: { quoteBadValue?: boolean } = {}) {
  return z
    .union([z.number(), z.string()])
    .transform((v, ctx) => {
      const text = typeof v === "number" ? String(v) : v.trim();
      if (text === "") {
        ctx.addIssue({ code: "custom", message: `${label} is empty` });
        return z.NEVER;
      }
      const n = Number(text);
      if (!Number.isFinite(n)) {
        ctx.addIssue({
          code: "custom",
          message: opts.quoteBadValue ? `${label} must be a number; got "${text}"` : `${label} must be a number`,
        });
        return z.NEVER;
      }
      return n;
    })
    .pipe(z.number().min(min, `${label} must be at least ${min} ${unit}`).max(max, `${label} must be at most ${max} ${unit}`));
}
