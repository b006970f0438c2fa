import "server-only";
import { sql, type Kysely } from "kysely";
import { appendAudit } from "../audit/append";
import { signOffInShop, stageOutOfTolerance, type StageOutOfTolerance } from "./stage";
import type { Database } from "../schema";

// The e-mail outbox of sign-offs (review_notices, filled by a trigger when a sign-off is stored).
// Claimed in small batches with SKIP LOCKED so two app instances never send the same notice; a
// claim older than CLAIM_STALE_MS (an instance died mid-send) is taken over.

const CLAIM_STALE_MS = 5 * 60_000;
const MAX_ATTEMPTS = 5;

interface ClaimedNotice {
  id: string;
  shopId: string;
  signOffId: string;
  workOrderId: string;
  attempts: number;
}

export async function claimNotices(db: Kysely<Database>, limit = 20): Promise<ClaimedNotice[]> {
  const r = await sql<{ id: string; shop_id: string; sign_off_id: string; work_order_id: string; attempts: number }>`
    UPDATE review_notices n SET state = 'sending', attempts = n.attempts + 1, claimed_at = now()
    WHERE n.id IN (
      SELECT id FROM review_notices
      WHERE state = 'waiting' OR (state = 'sending' AND claimed_at < now() - make_interval(secs => ${CLAIM_STALE_MS / 1000}))
      ORDER BY id LIMIT ${limit} FOR UPDATE SKIP LOCKED
    )
    RETURNING n.id::text, n.shop_id, n.sign_off_id, n.work_order_id, n.attempts
  `.execute(db);
  return r.rows.map((n) => ({ id: n.id, shopId: n.shop_id, signOffId: n.sign_off_id, workOrderId: n.work_order_id, attempts: n.attempts }));
}

export interface NoticeFacts {
  number: number;
  title: string;
  bike: string;
  tagCode: string;
  stageTitle: string;
  signedBy: { id: string; name: string };
  signedAt: Date;
  decided: boolean;
  outOfTolerance: StageOutOfTolerance[];
  /** Active supervisors of the shop other than the one who signed off; the office when there is none. */
  recipients: Array<{ id: string; name: string; email: string }>;
}

export async function noticeFacts(db: Kysely<Database>, n: ClaimedNotice): Promise<NoticeFacts | null> {
  const so = await signOffInShop(db, n.shopId, n.signOffId);
  if (!so) return null;
  const [oot, decided, signer, people] = await Promise.all([
    stageOutOfTolerance(db, so.workOrderId, so.templateVersionId, so.stageKey),
    db.selectFrom("review_decisions").select("id").where("sign_off_id", "=", so.id).executeTakeFirst(),
    db.selectFrom("users").select(["id", "name"]).where("id", "=", so.signedBy).executeTakeFirstOrThrow(),
    db
      .selectFrom("users")
      .select(["id", "name", "email", "role"])
      .where("shop_id", "=", n.shopId)
      .where("active", "=", true)
      .where("role", "in", ["supervisor", "office"])
      .where("id", "<>", so.signedBy)
      .orderBy("email")
      .execute(),
  ]);
  const supervisors = people.filter((p) => p.role === "supervisor");
  return {
    number: so.number,
    title: so.title,
    bike: `${so.make} ${so.model}`,
    tagCode: so.tagCode,
    stageTitle: so.stageTitle ?? so.stageKey,
    signedBy: signer,
    signedAt: new Date(so.deviceTime as unknown as string),
    decided: Boolean(decided),
    outOfTolerance: oot.filter((o) => !o.accepted),
    recipients: (supervisors.length ? supervisors : people).map(({ id, name, email }) => ({ id, name, email })),
  };
}

export async function finishNotice(
  db: Kysely<Database>,
  n: ClaimedNotice,
  outcome: { state: "sent" | "not_needed" } | { state: "retry" | "failed"; error: string },
  audit?: { recipients: string[]; subject: string },
): Promise<void> {
  const state = outcome.state === "retry" ? (n.attempts >= MAX_ATTEMPTS ? "failed" : "waiting") : outcome.state;
  await db
    .updateTable("review_notices")
    .set({
      state,
      last_error: "error" in outcome ? outcome.error.slice(0, 500) : null,
      done_at: state === "waiting" ? null : new Date(),
    })
    .where("id", "=", n.id)
    .execute();
  if (state === "sent" || state === "failed") {
    await appendAudit(db, [
      {
        shopId: n.shopId,
        actorId: null,
        action: "review.notice-mail",
        entity: "sign_off",
        entityId: n.signOffId,
        workOrderId: n.workOrderId,
        outcome: state === "sent" ? "accepted" : "refused",
        reason: "error" in outcome ? outcome.error.slice(0, 500) : null,
        detail: { recipients: audit?.recipients ?? [], subject: audit?.subject ?? null, attempts: n.attempts },
      },
    ]);
  }
}
