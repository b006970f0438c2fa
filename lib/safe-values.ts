import { z } from "zod";

// Values that PostgreSQL and every later reader (PDF, CSV, e-mail, another tablet) accept, checked
// at the edge. A text with a NUL character or a lone UTF-16 surrogate is refused by PostgreSQL's
// text type or by a UTF-8 encoder; a date in year 0000 or 275760 is refused by timestamptz or by
// JavaScript; NaN and Infinity are refused by numeric columns and JSON. Such input is answered
// here, per field and in workshop words, never by a failed transaction that takes other work
// down with it.

/** The largest value of PostgreSQL's integer (int4) column: a job number, a version. */
export const INT4_MAX = 2_147_483_647;

/** Earliest and latest instants Benchtag accepts for anything that happened at the bench or the office. */
export const SANE_TIME_RANGE = { from: Date.UTC(2000, 0, 1), to: Date.UTC(2100, 0, 1) } as const;

/** NUL and the other control characters except tab, line feed and carriage return. */
// eslint-disable-next-line no-control-regex -- finding control characters is the point
const CONTROL = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F]/u;
/** Line breaks and tabs: not allowed in a one-line text. */
const LINE_BREAK_OR_TAB = /[\t\n\r\u2028\u2029]/u;

/** True when `s` holds a UTF-16 surrogate that is not part of a pair (not encodable as UTF-8). */
export function hasLoneSurrogate(s: string): boolean {
  for (let i = 0; i < s.length; i++) {
    const c = s.charCodeAt(i);
    if (c >= 0xd800 && c <= 0xdbff) {
      const next = s.charCodeAt(i + 1);
      if (next >= 0xdc00 && next <= 0xdfff) {
        i++;
        continue;
      }
      return true;
    }
    if (c >= 0xdc00 && c <= 0xdfff) return true;
  }
  return false;
}

/** Why a text cannot be stored, in plain words, or null when it can. */
export function textProblem(s: string, opts: { label: string; multiline?: boolean }): string | null {
  if (s.includes("\u0000")) return `${opts.label} holds a NUL character, which cannot be stored: retype it.`;
  if (hasLoneSurrogate(s)) return `${opts.label} holds a broken character (half of an emoji or symbol): retype it.`;
  if (CONTROL.test(s)) return `${opts.label} holds a control character, which cannot be stored: retype it.`;
  if (!opts.multiline && LINE_BREAK_OR_TAB.test(s)) return `${opts.label} must be on one line (no line breaks or tabs).`;
  return null;
}

export interface SafeTextOptions {
  /** The label the person sees, used in every message. */
  label: string;
  max: number;
  /** At least this many characters after trimming (0: may be empty). */
  min?: number;
  /** Message when shorter than `min`. */
  tooShort?: string;
  /** Line breaks allowed (notes); tabs too. */
  multiline?: boolean;
}

/** A trimmed text that PostgreSQL and the next reader accept, with messages naming the field. */
export function safeText(opts: SafeTextOptions) {
  const { label, max, min = 0 } = opts;
  return z
    .string({ error: `${label} must be text.` })
    .trim()
    .min(min, opts.tooShort ?? (min <= 1 ? `Enter the ${label.toLowerCase()}.` : `${label}: at least ${min} characters.`))
    .max(max, `${label}: at most ${max} characters.`)
    .superRefine((s, ctx) => {
      const problem = textProblem(s, opts);
      if (problem) ctx.addIssue({ code: "custom", message: problem });
    });
}

/** True when `ms` is a real instant inside SANE_TIME_RANGE. */
export function isSaneInstant(ms: number): boolean {
  return Number.isFinite(ms) && ms >= SANE_TIME_RANGE.from && ms < SANE_TIME_RANGE.to;
}

/** An ISO 8601 date-time with a zone, between the years 2000 and 2099, kept as the string sent. */
export function saneInstant(label: string) {
  return z.string({ error: `${label} must be a date and time.` }).superRefine((s, ctx) => {
    if (!z.iso.datetime({ offset: true }).safeParse(s).success) {
      ctx.addIssue({ code: "custom", message: `${label} must be a date and time with a time zone, e.g. 2026-12-02T09:30:00.000Z.` });
      return;
    }
    if (!isSaneInstant(Date.parse(s))) {
      ctx.addIssue({ code: "custom", message: `${label} must be between the years 2000 and 2099; the tablet's clock may be wrong.` });
    }
  });
}

/** A finite number (never NaN or Infinity) between `min` and `max`, with the unit in the message. */
export function finiteNumber(opts: { label: string; min: number; max: number; unit?: string; int?: boolean }) {
  const unit = opts.unit ? ` ${opts.unit}` : "";
  const range = `between ${opts.min}${unit} and ${opts.max}${unit}`;
  let n = z.number({ error: `${opts.label} must be a number ${range}.` });
  if (opts.int) n = n.int(`${opts.label} must be a whole number ${range}.`);
  return n.min(opts.min, `${opts.label} must be ${range}.`).max(opts.max, `${opts.label} must be ${range}.`);
}

/** Whether `s` can be stored as text by PostgreSQL and encoded as UTF-8 (no NUL, no lone surrogate). */
function storableString(s: string): string {
  if (!s.includes("\u0000") && !hasLoneSurrogate(s)) return s;
  let out = "";
  for (let i = 0; i < s.length; i++) {
    const c = s.charCodeAt(i);
    const pair = c >= 0xd800 && c <= 0xdbff && s.charCodeAt(i + 1) >= 0xdc00 && s.charCodeAt(i + 1) <= 0xdfff;
    if (pair) {
      out += s[i] + s[i + 1];
      i++;
    } else if (c === 0 || (c >= 0xd800 && c <= 0xdfff)) {
      out += `\\u${c.toString(16).padStart(4, "0")}`;
    } else {
      out += s[i];
    }
  }
  return out;
}

/**
 * A copy of anything that arrived from outside (a refused operation, however malformed), that a
 * jsonb column and every later reader accept: a NUL or lone surrogate is written out as the six
 * characters `\u0000`, numbers JSON cannot hold (NaN, Infinity) become text, nesting stops at 16
 * levels, and a copy over `maxChars` of JSON is kept as its first `maxChars` characters of text.
 * For the audit log's record of what was refused or discarded; never for data that is applied.
 */
export function storableCopy(value: unknown, maxChars = 16_000): unknown {
  const walk = (v: unknown, depth: number): unknown => {
    if (typeof v === "string") return storableString(v);
    if (typeof v === "number") return Number.isFinite(v) ? v : String(v);
    if (v === null || typeof v === "boolean") return v;
    if (typeof v !== "object") return v === undefined ? null : storableString(String(v));
    if (depth >= 16) return "(nested too deep)";
    if (Array.isArray(v)) return v.map((x) => walk(x, depth + 1));
    return Object.fromEntries(Object.entries(v).map(([k, x]) => [storableString(k), walk(x, depth + 1)]));
  };
  const copy = walk(value, 0);
  const text = JSON.stringify(copy) ?? "null";
  return text.length <= maxChars ? copy : { truncated: true, text: storableString(text.slice(0, maxChars)) };
}

/** A text in a request that cannot be stored, where it is and why (in the words of `textProblem`). */
export interface UnstorableText {
  path: (string | number)[];
  message: string;
}

/**
 * Every text in `value` (a parsed JSON body, a query, a form's fields; object keys too) that
 * PostgreSQL or a UTF-8 reader refuses: a NUL, another control character, or a broken character.
 * Line breaks and tabs are left to each field's own rule. `labelAt` names the field at a path, as
 * the person sees it. At most `max` are listed; nesting is followed 32 levels deep.
 */
export function unstorableTexts(value: unknown, labelAt: (path: (string | number)[]) => string, max = 50): UnstorableText[] {
  const found: UnstorableText[] = [];
  const check = (s: string, path: (string | number)[]) => {
    const message = textProblem(s, { label: labelAt(path), multiline: true });
    if (message) found.push({ path, message });
  };
  const walk = (v: unknown, path: (string | number)[], depth: number): void => {
    if (found.length >= max || depth > 32) return;
    if (typeof v === "string") check(v, path);
    else if (Array.isArray(v)) v.forEach((x, i) => walk(x, [...path, i], depth + 1));
    else if (v !== null && typeof v === "object")
      for (const [k, x] of Object.entries(v)) {
        check(k, [...path, k]);
        walk(x, [...path, k], depth + 1);
      }
  };
  walk(value, [], 0);
  return found.slice(0, max);
}

/**
 * An uploaded file's name as it can be stored and shown: control characters (a NUL among them,
 * which PostgreSQL refuses; C1 ones too) and half emoji dropped, at most `max` characters (never
 * cutting a character in two), "file" when nothing is left. A name is a label, not the file's
 * content, so it is tidied rather than refused.
 */
export function storableFileName(name: string, max = 200): string {
  // eslint-disable-next-line no-control-regex -- dropping control characters is the point
  const kept = [...name.replace(/[\u0000-\u001F\u007F-\u009F]/gu, "")].filter((ch) => !hasLoneSurrogate(ch));
  const cut = kept.slice(0, max).join("").trim();
  return cut || "file";
}

/** A declared content type as it can be stored: "type/subtype" of at most 100 plain characters, else `fallback`. */
export function storableContentType(declared: string, fallback = "application/octet-stream"): string {
  const bare = declared.split(";")[0].trim().toLowerCase();
  return bare.length <= 100 && /^[a-z0-9][a-z0-9!#$&^_.+-]*\/[a-z0-9][a-z0-9!#$&^_.+-]*$/.test(bare) ? bare : fallback;
}
