import "server-only";
import { sql, type Kysely } from "kysely";
import type { SessionUser } from "@/lib/auth/session-user";
import { Refusal } from "@/lib/errors";
import { isUuid } from "@/lib/ids";
import type { HandedOverWork } from "@/lib/work-orders/open-items";
import { appendAudit } from "../audit/append";
import { storableCopy } from "@/lib/safe-values";
import type { Database } from "../schema";

// The unsent work of a tablet whose session the office ended, handed over as it was on the
// tablet (not merged into the record: nobody signed in stands behind it any more). The office
// reads it and downloads it; it is kept for good. Kept as a copy jsonb accepts, whatever the
// tablet held (a NUL or half of an emoji is written out as its \u escape; nothing is cut short):
// an entry the server would refuse must not stop the rest from being handed over.
// Each job its entries were recorded on keeps an open item (its gates to "ready" and "handed
// over") until the office settles that job's part of the hand-over with a written note.

/**
 * Hand-overs one ended session may make. A tablet makes one, and a further round or two for work
 * recorded while the first was on its way (lib/client/session-end.ts): an ended session's cookie
 * must not become a way to fill the database for its seven days.
 */
export const MAX_HANDOVERS_PER_SESSION = 10;

export async function recordOutboxHandover(
  db: Kysely<Database>,
  h: {
    shopId: string;
    userId: string;
    sessionId: string;
    /** The tablet the session was named to, when it was (the hand-over must come from that one). */
    sessionDeviceId?: string | null;
    deviceId: string;
    entries: unknown[];
    photosLeft: unknown[];
  },
): Promise<{ id: string }> {
  if (h.sessionDeviceId && h.sessionDeviceId !== h.deviceId)
    throw new Refusal("This hand-over names another tablet than the one this session was on: nothing was kept.", 403);
  return db.transaction().execute(async (trx) => {
    // one session's hand-overs one at a time, so the count below holds
    await trx.selectFrom("sessions").select("id").where("id", "=", h.sessionId).forUpdate().execute();
    const before = await trx
      .selectFrom("outbox_handovers")
      .select((eb) => eb.fn.countAll<string>().as("n"))
      .where("session_id", "=", h.sessionId)
      .executeTakeFirstOrThrow();
    if (Number(before.n) >= MAX_HANDOVERS_PER_SESSION)
      throw new Refusal(
        `This tablet has handed its work over ${MAX_HANDOVERS_PER_SESSION} times already: the office has it on the Sign-ins page. Nothing more was kept.`,
        409,
      );
    // the shop's sync lock, as the gated moves take it: no hand-over lands between their check and the move
    await sql`SELECT benchtag_lock_shop_sync(${h.shopId}::uuid)`.execute(trx);
    const made = await trx
      .insertInto("outbox_handovers")
      .values({
        shop_id: h.shopId,
        user_id: h.userId,
        session_id: h.sessionId,
        device_id: h.deviceId,
        entry_count: h.entries.length,
        entries: JSON.stringify(storableCopy(h.entries, Infinity)),
        photos_left: JSON.stringify(storableCopy(h.photosLeft, Infinity)),
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    const entries = perJob(h.entries);
    const photos = perJob(h.photosLeft);
    const named = [...new Set([...entries.keys(), ...photos.keys()])];
    const jobs = named.length
      ? await trx.selectFrom("work_orders").select("id").where("shop_id", "=", h.shopId).where("id", "in", named).execute()
      : [];
    if (jobs.length)
      await trx
        .insertInto("outbox_handover_jobs")
        .values(
          jobs.map((j) => ({
            handover_id: made.id,
            work_order_id: j.id,
            shop_id: h.shopId,
            entry_count: entries.get(j.id) ?? 0,
            photo_count: photos.get(j.id) ?? 0,
          })),
        )
        .execute();
    return made;
  });
}

/** How many of the handed-over entries (or photos) name each job (by the tablet's `workOrderId`; one naming none holds none). */
function perJob(items: unknown[]): Map<string, number> {
  const out = new Map<string, number>();
  for (const e of items) {
    const id = typeof e === "object" && e !== null ? (e as { workOrderId?: unknown }).workOrderId : undefined;
    if (typeof id === "string" && isUuid(id)) out.set(id.toLowerCase(), (out.get(id.toLowerCase()) ?? 0) + 1);
  }
  return out;
}

/** The jobs hand-overs name ("j"), each with its settlement ("s") when the office has made it. */
const jobsWithSettlement = (db: Kysely<Database>) =>
  db
    .selectFrom("outbox_handover_jobs as j")
    .leftJoin("outbox_handover_settlements as s", (join) =>
      join.onRef("s.handover_id", "=", "j.handover_id").onRef("s.work_order_id", "=", "j.work_order_id"),
    );

/** A job's hand-overs the office has not settled yet (each an open item of the job), oldest first. */
export async function unsettledHandoversOf(db: Kysely<Database>, shopId: string, workOrderId: string): Promise<HandedOverWork[]> {
  const rows = await jobsWithSettlement(db)
    .innerJoin("outbox_handovers as h", "h.id", "j.handover_id")
    .innerJoin("users as u", "u.id", "h.user_id")
    .select([
      "j.handover_id as handoverId",
      "j.entry_count as entryCount",
      "j.photo_count as photoCount",
      "u.name as by",
      "h.device_id as deviceId",
    ])
    .where("j.work_order_id", "=", workOrderId)
    .where("j.shop_id", "=", shopId)
    .where("s.id", "is", null)
    .orderBy("h.received_at")
    .execute();
  return rows;
}

/**
 * The office settles a hand-over's entries on one job with a written note (what was re-entered on
 * the record, or why nothing needs to be): that job's open item closes. Once per job and hand-over;
 * audited, refusals too.
 */
export async function settleHandover(
  db: Kysely<Database>,
  user: SessionUser,
  handoverId: string,
  input: { workOrderId: string; note: string },
): Promise<{ id: string }> {
  // a job the hand-over does not hold may not be this shop's: it is named in the detail only
  const audit = (on: Kysely<Database>, outcome: "accepted" | "refused", reason?: string, jobKnown = true) =>
    appendAudit(on, [
      {
        shopId: user.shopId,
        actorId: user.id,
        action: "outbox.settled",
        entity: "outbox_handover",
        entityId: handoverId,
        workOrderId: jobKnown ? input.workOrderId : null,
        outcome,
        reason,
        detail: { note: input.note, ...(jobKnown ? {} : { workOrderId: input.workOrderId }) },
      },
    ]);
  const r = await db.transaction().execute(async (trx) => {
    await sql`SELECT benchtag_lock_shop_sync(${user.shopId}::uuid)`.execute(trx);
    const job = await jobsWithSettlement(trx)
      .innerJoin("work_orders as w", "w.id", "j.work_order_id")
      .select(["w.number", "s.id as settledId"])
      .where("j.handover_id", "=", handoverId)
      .where("j.work_order_id", "=", input.workOrderId)
      .where("j.shop_id", "=", user.shopId)
      .executeTakeFirst();
    if (!job) return { noSuchJob: true } as const;
    if (job.settledId) return { settledAlready: job.number } as const;
    const made = await trx
      .insertInto("outbox_handover_settlements")
      .values({ handover_id: handoverId, work_order_id: input.workOrderId, shop_id: user.shopId, note: input.note, settled_by: user.id })
      .returning("id")
      .executeTakeFirstOrThrow();
    await audit(trx, "accepted");
    return made;
  });
  if ("noSuchJob" in r) {
    await audit(db, "refused", "no entries on that job in this hand-over", false);
    throw new Refusal("This hand-over has no entries on that job.", 404);
  }
  if ("settledAlready" in r) {
    await audit(db, "refused", "settled already");
    throw new Refusal(`The handed-over work on job #${r.settledAlready} is settled already.`, 409);
  }
  return r;
}

export async function listOutboxHandovers(db: Kysely<Database>, shopId: string) {
  const handovers = await db
    .selectFrom("outbox_handovers as h")
    .innerJoin("users as u", "u.id", "h.user_id")
    .select(["h.id", "u.name as userName", "h.device_id as deviceId", "h.entry_count as entryCount", "h.received_at as receivedAt"])
    .where("h.shop_id", "=", shopId)
    .orderBy("h.received_at", "desc")
    .limit(50)
    .execute();
  const jobs = handovers.length
    ? await jobsWithSettlement(db)
        .innerJoin("work_orders as w", "w.id", "j.work_order_id")
        .leftJoin("users as u", "u.id", "s.settled_by")
        .select([
          "j.handover_id as handoverId",
          "j.work_order_id as workOrderId",
          "w.number",
          "j.entry_count as entryCount",
          "j.photo_count as photoCount",
          "s.note",
          "s.settled_at as settledAt",
          "u.name as settledBy",
        ])
        .where(
          "j.handover_id",
          "in",
          handovers.map((h) => h.id),
        )
        .orderBy("w.number")
        .execute()
    : [];
  return handovers.map((h) => ({ ...h, jobs: jobs.filter((j) => j.handoverId === h.id) }));
}

export async function outboxHandover(db: Kysely<Database>, shopId: string, id: string) {
  return db
    .selectFrom("outbox_handovers")
    .select(["id", "user_id as userId", "device_id as deviceId", "entries", "photos_left as photosLeft", "received_at as receivedAt"])
    .where("shop_id", "=", shopId)
    .where("id", "=", id)
    .executeTakeFirst();
}
