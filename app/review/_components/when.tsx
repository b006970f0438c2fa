import { formatDayTime } from "@/lib/format/dates";
import type { Verdict } from "@/lib/sync/readings";

/** Device time, and when the server received it (they differ when the tablet was offline). */
export function When({ device, received }: { device: string; received: string | null }) {
  const gapMin = received ? Math.round((Date.parse(received) - Date.parse(device)) / 60_000) : 0;
  return (
    <span className="text-sm">
      <span>on the tablet {formatDayTime(device)}</span>
      {received && (
        <span className="block text-steel-700">
          received {formatDayTime(received)}
          {gapMin >= 2 ? ` (${gapMin} min later)` : ""}
        </span>
      )}
    </span>
  );
}

export function VerdictTag({ verdict }: { verdict: Verdict }) {
  if (verdict === "in")
    return (
      <span className="inline-flex items-center gap-1 rounded border-2 border-pass bg-pass-light px-2 font-bold text-pass">
        <span aria-hidden="true">●</span> In
      </span>
    );
  return (
    <span className="inline-flex items-center gap-1 rounded border-2 border-fail bg-fail-light px-2 font-bold text-fail">
      <span aria-hidden="true">{verdict === "high" ? "▲" : "▼"}</span> {verdict === "high" ? "High" : "Low"}
    </span>
  );
}
