// Dates as the office reads them (day month year), from a Date or an ISO string.
export function day(v: unknown): string {
  return new Date(v as string).toLocaleDateString("en-GB", { day: "numeric", month: "short", year: "numeric" });
}
export function dayTime(v: unknown): string {
  return new Date(v as string).toLocaleString("en-GB", {
    day: "numeric",
    month: "short",
    year: "numeric",
    hour: "2-digit",
    minute: "2-digit",
  });
}
