import Papa from "papaparse";
import { describe, expect, it } from "vitest";
import { AUDIT_CSV_COLUMNS, auditCsvChunk, type AuditEntry } from "@/lib/review/audit-csv";

const row = (over: Partial<AuditEntry> = {}): AuditEntry => ({
  id: "41",
  at: "2026-12-02T09:15:00.000Z",
  workOrderNumber: 1006,
  actorName: "Dana Kowal",
  actorEmail: "dana@gannet-street.test",
  actorRole: "supervisor",
  deviceId: null,
  action: "review.send-back",
  entity: "sign_off",
  entityId: "a1",
  outcome: "accepted",
  reason: 'Gap, "too wide"\non cyl 2',
  detail: { reopenedSteps: ["Top ring end gap"] },
  ...over,
});

describe("audit CSV", () => {
  it("writes the header once, CRLF lines, and reads back to the same values", () => {
    const text = auditCsvChunk([row()], true) + auditCsvChunk([row({ id: "42", workOrderNumber: null, reason: null })], false);
    expect(text.startsWith(`${AUDIT_CSV_COLUMNS.join(",")}\r\n`)).toBe(true);
    expect(text.endsWith("\r\n")).toBe(true);
    const parsed = Papa.parse<Record<string, string>>(text, { header: true, skipEmptyLines: true });
    expect(parsed.data).toEqual([
      {
        entry: "41",
        logged_at: "2026-12-02T09:15:00.000Z",
        work_order: "1006",
        actor_name: "Dana Kowal",
        actor_email: "dana@gannet-street.test",
        actor_role: "supervisor",
        device: "",
        action: "review.send-back",
        entity: "sign_off",
        entity_id: "a1",
        outcome: "accepted",
        reason: 'Gap, "too wide"\non cyl 2',
        detail_json: '{"reopenedSteps":["Top ring end gap"]}',
      },
      expect.objectContaining({ entry: "42", work_order: "", reason: "" }),
    ]);
  });

  it("neutralises cells a spreadsheet would run as a formula", () => {
    for (const danger of ["=1+1", "+44 7700", "-2", "@SUM(A1)"]) {
      const parsed = Papa.parse<Record<string, string>>(auditCsvChunk([row({ reason: danger })], true), {
        header: true,
        skipEmptyLines: true,
      });
      expect(parsed.data[0].reason).toBe(`'${danger}`);
    }
  });

  it("an empty export is the header line alone", () => {
    expect(auditCsvChunk([], true)).toBe(`${AUDIT_CSV_COLUMNS.join(",")}\r\n`);
    expect(auditCsvChunk([], false)).toBe("");
  });
});
