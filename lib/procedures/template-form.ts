import type { z } from "zod";
import type { torquePassSchema } from "./template-schema";

// Helpers for editing a template document in a form. Pure.

type Pass = z.input<typeof torquePassSchema>;

// "50%, 100%" → [{percent:50},{percent:100}]; "20, 40" → [{value:20},{value:40}]. Unreadable parts
// become NaN so the schema names them instead of dropping them silently.
export function parsePasses(text: string): Pass[] {
  return text
    .split(",")
    .map((t) => t.trim())
    .filter(Boolean)
    .map((t) => (t.endsWith("%") ? { percent: Number(t.slice(0, -1).trim()) } : { value: Number(t) }));
}

export function passesText(passes: Pass[] | undefined): string {
  return (passes ?? []).map((p) => ("percent" in p ? `${p.percent}%` : String(p.value))).join(", ");
}

export function listText(items: Array<string | number> | undefined): string {
  return (items ?? []).join(", ");
}

export function parseList(text: string): string[] {
  return text
    .split(",")
    .map((t) => t.trim())
    .filter(Boolean);
}

// A copy of `obj` with the value at `path` replaced (arrays and objects copied along the way).
export function setAt<T>(obj: T, path: Array<string | number>, value: unknown): T {
  if (!path.length) return value as T;
  const [head, ...rest] = path;
  const copy = (Array.isArray(obj) ? [...obj] : { ...(obj as object) }) as Record<string | number, unknown>;
  copy[head] = setAt(copy[head], rest, value);
  return copy as T;
}
