/**
 * The audit log as CSV. Our own column list (documented in README.md, "Audit log CSV"):
 * entry, logged_at, work_order, actor_name, actor_email, actor_role, device, action, entity,
 * entity_id, outcome, reason, detail_json. Pure: papaparse writes the quoting; cells that a
 * spreadsheet would run as a formula (= + - @ at the start) are prefixed with ' to neutralise them.
 */
import Papa from "papaparse";

export const AUDIT_CSV_COLUMNS = [
  "entry",
  "logged_at",
  "work_order",
  "actor_name",
  "actor_email",
  "actor_role",
  "device",
  "action",
  "entity",
  "entity_id",
  "outcome",
  "reason",
  "detail_json",
] as const;

/** One audit log entry as the screen and the CSV show it. */
export interface AuditEntry {
  id: string;
  at: string;
  workOrderNumber: number | null;
  actorName: string | null;
  actorEmail: string | null;
  actorRole: string | null;
  deviceId: string | null;
  action: string;
  entity: string;
  entityId: string | null;
  outcome: "accepted" | "refused";
  reason: string | null;
  detail: Record<string, unknown>;
}

function auditCsvCells(r: AuditEntry): string[] {
  return [
    r.id,
    r.at,
    r.workOrderNumber === null ? "" : String(r.workOrderNumber),
    r.actorName ?? "",
    r.actorEmail ?? "",
    r.actorRole ?? "",
    r.deviceId ?? "",
    r.action,
    r.entity,
    r.entityId ?? "",
    r.outcome,
    r.reason ?? "",
    JSON.stringify(r.detail ?? {}),
  ];
}

/** CSV lines (CRLF-terminated) for the rows; with the header line when `header` is true. */
export function auditCsvChunk(rows: readonly AuditEntry[], header: boolean): string {
  const data = rows.map(auditCsvCells);
  if (!data.length && !header) return "";
  const text = Papa.unparse({ fields: [...AUDIT_CSV_COLUMNS], data }, { header, newline: "\r\n", quotes: false, escapeFormulae: true });
  if (!text) return "";
  return text.endsWith("\r\n") ? text : `${text}\r\n`;
}
