import { sql, type Kysely } from "kysely";
import type { Database } from "../schema";

// The demo build record (demo-dyno.ts) is written straight into the bench tables, as if it had
// been synced long ago. Give it the audit trail a sync and a review would have left, so the audit
// page of the demo shows who did what: one entry per operation, one per decision.
export async function seedDemoReview(db: Kysely<Database>, shopId: string): Promise<void> {
  // Both kinds in one statement, in time order, so the log's order matches the demo's history.
  await sql`
    INSERT INTO audit_log (shop_id, at, actor_id, device_id, action, entity, entity_id, work_order_id, outcome, reason, detail)
    SELECT * FROM (
    SELECT o.shop_id, o.device_time AS at, o.author_id, o.device_id, 'sync.' || o.kind, 'operation', o.id::text, o.work_order_id,
      'accepted', o.flag_reason, jsonb_build_object('stamp', o.stamp, 'flagged', o.flagged)
    FROM operations o
    WHERE o.shop_id = ${shopId}::uuid
      AND NOT EXISTS (SELECT 1 FROM audit_log a WHERE a.entity = 'operation' AND a.entity_id = o.id::text)
    UNION ALL
    SELECT w.shop_id, d.decided_at, d.decided_by, NULL, CASE d.decision WHEN 'approved' THEN 'review.approve' ELSE 'review.send-back' END,
      'sign_off', s.id::text, s.work_order_id, 'accepted', NULLIF(d.reason, ''),
      jsonb_build_object('decisionId', d.id, 'stageKey', s.stage_key, 'reopenedStepIds', to_jsonb(d.reopened_step_ids), 'acceptances', '[]'::jsonb)
    FROM review_decisions d JOIN sign_offs s ON s.id = d.sign_off_id JOIN work_orders w ON w.id = s.work_order_id
    WHERE w.shop_id = ${shopId}::uuid
      AND NOT EXISTS (SELECT 1 FROM audit_log a WHERE a.action LIKE 'review.%' AND a.detail->>'decisionId' = d.id::text)
    ) history ORDER BY at
  `.execute(db);
}
