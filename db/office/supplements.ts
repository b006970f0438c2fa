import "server-only";
import { createHash, randomBytes } from "node:crypto";
import { sql, type Kysely, type Transaction } from "kysely";
import { Refusal } from "@/lib/errors";
import { formatDay } from "@/lib/format/dates";
import { ANSWER_LINK_DAYS, mayWriteExtraWork } from "@/lib/office/extra-work";
import { amountFor } from "@/lib/money/final-bill";
import { decisionsSchema, supplementSchema, type DecisionsInput, type SupplementInput } from "@/lib/office/extra-work-schemas";
import { appendAudit } from "../audit/append";
import type { Database } from "../schema";
import { pricedLineRow } from "./price-lines";

// Extra work found while the bike is being built: the office writes a supplement (finding, photos,
// parts and labour lines), the customer answers each line once — approve or decline, with a comment —
// on their page or through the e-mailed one-time link. Nothing here is edited afterwards.

type Db = Kysely<Database> | Transaction<Database>;

export const tokenHash = (token: string) => createHash("sha256").update(token, "utf8").digest("hex");

/** The work order's owner (customer id) and state, locked for the change. */
async function lockJob(trx: Db, shopId: string, workOrderId: string) {
  const wo = await trx
    .selectFrom("work_orders as w")
    .innerJoin("bikes as b", "b.id", "w.bike_id")
    .select(["w.id", "w.status", "w.number", "b.customer_id as customerId"])
    .where("w.id", "=", workOrderId)
    .where("w.shop_id", "=", shopId)
    .forUpdate("w")
    .executeTakeFirst();
  if (!wo) throw new Refusal("No such work order in this shop.", 404);
  return wo;
}

async function billIssued(trx: Db, workOrderId: string) {
  return trx.selectFrom("invoices").select("number").where("work_order_id", "=", workOrderId).executeTakeFirst();
}

/** The office writes extra work and a one-time answer link for the bike's owner (the token is returned once, for the e-mail). */
export async function writeSupplement(db: Kysely<Database>, shopId: string, userId: string, workOrderId: string, input: SupplementInput) {
  const s = supplementSchema.parse(input);
  return db.transaction().execute(async (trx) => {
    const wo = await lockJob(trx, shopId, workOrderId);
    if (!mayWriteExtraWork(wo.status))
      throw new Refusal("Extra work can be written while the bike is in build, in review or on the dyno.", 409);
    const approved = await trx
      .selectFrom("quotes")
      .select("id")
      .where("work_order_id", "=", workOrderId)
      .where("status", "=", "approved")
      .executeTakeFirst();
    if (!approved) throw new Refusal("This job has no approved quote to add extra work to.", 409);
    const issued = await billIssued(trx, workOrderId);
    if (issued)
      throw new Refusal(`The bill for this job is already issued (bill ${issued.number}); extra work cannot be added to it.`, 409);
    if (s.photoIds.length) {
      const found = await trx
        .selectFrom("attachments")
        .select("id")
        .where("id", "in", s.photoIds)
        .where("work_order_id", "=", workOrderId)
        .where("shop_id", "=", shopId)
        .execute();
      if (found.length !== new Set(s.photoIds).size)
        throw new Refusal("Photos: choose photos of this job.", 422, [{ path: "photoIds", message: "Photos: choose photos of this job." }]);
    }
    const shop = await trx.selectFrom("shops").select("currency").where("id", "=", shopId).executeTakeFirstOrThrow();
    const last = await trx
      .selectFrom("supplements")
      .select((eb) => eb.fn.max("number").as("n"))
      .where("work_order_id", "=", workOrderId)
      .executeTakeFirst();
    const number = (last?.n ?? 0) + 1;
    const sup = await trx
      .insertInto("supplements")
      .values({ shop_id: shopId, work_order_id: workOrderId, number, finding: s.finding, currency: shop.currency, created_by: userId })
      .returning(["id", "number"])
      .executeTakeFirstOrThrow();
    await trx
      .insertInto("supplement_lines")
      .values(s.lines.map((l, i) => ({ supplement_id: sup.id, ...pricedLineRow(l, i, amountFor(l.quantityHundredths, l.unitPriceMinor)) })))
      .execute();
    if (s.photoIds.length)
      await trx
        .insertInto("supplement_photos")
        .values([...new Set(s.photoIds)].map((a) => ({ supplement_id: sup.id, attachment_id: a })))
        .execute();
    await appendAudit(trx, [
      { shopId, actorId: userId, action: "supplement.write", entity: "supplement", entityId: sup.id, workOrderId, outcome: "accepted" },
    ]);
    return { supplementId: sup.id, number: sup.number };
  });
}

/**
 * The one-time answer link of a supplement, made by the queue worker as it sends the e-mail (the
 * outbox holds only a placeholder, never a working link): 32 random bytes, of which the database
 * keeps the SHA-256; it works for ANSWER_LINK_DAYS from now, for the bike's owner. A send tried
 * again makes a new link (the one of a send that failed was never delivered).
 */
export async function makeSupplementLink(db: Kysely<Database>, supplementId: string): Promise<string> {
  const sup = await db
    .selectFrom("supplements as s")
    .innerJoin("work_orders as w", "w.id", "s.work_order_id")
    .innerJoin("bikes as b", "b.id", "w.bike_id")
    .select(["s.shop_id as shopId", "b.customer_id as customerId"])
    .where("s.id", "=", supplementId)
    .executeTakeFirstOrThrow();
  const token = randomBytes(32).toString("base64url");
  await db
    .insertInto("supplement_links")
    .values({
      shop_id: sup.shopId,
      supplement_id: supplementId,
      customer_id: sup.customerId,
      token_sha256: tokenHash(token),
      expires_at: new Date(Date.now() + ANSWER_LINK_DAYS * 86_400_000),
    })
    .execute();
  return token;
}

type Answerer = { userId: string; linkId: null } | { userId: null; linkId: string };

/** Records the answers to a supplement's lines: every line still waiting answered, each once. */
async function recordAnswers(trx: Transaction<Database>, supplementId: string, input: DecisionsInput, by: Answerer) {
  const d = decisionsSchema.parse(input);
  const sup = await trx
    .selectFrom("supplements")
    .select(["id", "shop_id", "work_order_id", "number"])
    .where("id", "=", supplementId)
    .executeTakeFirstOrThrow();
  const issued = await billIssued(trx, sup.work_order_id);
  if (issued)
    throw new Refusal(
      `The bill for this job is already issued (bill ${issued.number}); nothing was changed. Please ask the workshop.`,
      409,
    );
  const lines = await trx
    .selectFrom("supplement_lines as l")
    .leftJoin("supplement_decisions as d", "d.supplement_line_id", "l.id")
    .select(["l.id", "l.position", "d.id as decisionId"])
    .where("l.supplement_id", "=", supplementId)
    .orderBy("l.position")
    .execute();
  const byId = new Map(lines.map((l) => [l.id, l]));
  for (const a of d.decisions) {
    const l = byId.get(a.lineId);
    if (!l) throw new Refusal("Answers: a line is not part of this extra work; nothing was changed.", 422);
    if (l.decisionId) throw new Refusal(`Line ${l.position + 1} was already answered; an answer is not changed. Nothing was changed.`, 409);
  }
  const waiting = lines.filter((l) => !l.decisionId && !d.decisions.some((a) => a.lineId === l.id));
  if (waiting.length)
    throw new Refusal(
      `Answer every line: line${waiting.length > 1 ? "s" : ""} ${waiting.map((l) => l.position + 1).join(", ")} still need an answer.`,
      422,
    );
  await trx
    .insertInto("supplement_decisions")
    .values(
      d.decisions.map((a) => ({
        shop_id: sup.shop_id,
        work_order_id: sup.work_order_id,
        supplement_line_id: a.lineId,
        decision: a.decision,
        comment: a.comment,
        decided_by: by.userId,
        supplement_link_id: by.linkId,
      })),
    )
    .execute();
  await appendAudit(trx, [
    {
      shopId: sup.shop_id,
      actorId: by.userId,
      action: "supplement.answer",
      entity: "supplement",
      entityId: sup.id,
      workOrderId: sup.work_order_id,
      outcome: "accepted",
      detail: {
        via: by.linkId ? "link" : "signed-in",
        approved: d.decisions.filter((a) => a.decision === "approved").length,
        declined: d.decisions.filter((a) => a.decision === "declined").length,
      },
    },
  ]);
  return { supplementId: sup.id, workOrderId: sup.work_order_id, answered: d.decisions.length };
}

/** The signed-in customer answers extra work on their own bike (anyone else's: 403, nothing changed). */
export async function answerAsCustomer(
  db: Kysely<Database>,
  user: { id: string; shopId: string; customerId: string | null },
  supplementId: string,
  input: DecisionsInput,
) {
  return db.transaction().execute(async (trx) => {
    const owner = await trx
      .selectFrom("supplements as s")
      .innerJoin("work_orders as w", "w.id", "s.work_order_id")
      .innerJoin("bikes as b", "b.id", "w.bike_id")
      .select(["b.customer_id as customerId", "s.shop_id as shopId", "w.id as workOrderId"])
      .where("s.id", "=", supplementId)
      .forUpdate("w")
      .executeTakeFirst();
    if (!owner || owner.shopId !== user.shopId || !user.customerId || owner.customerId !== user.customerId)
      throw new Refusal("This extra work is not on your bike; nothing was changed.", 403);
    return recordAnswers(trx, supplementId, input, { userId: user.id, linkId: null });
  });
}

/** What an e-mailed link is, for its page: unknown, expired, used, or open with the work it asks about. */
export async function linkState(db: Kysely<Database>, token: string, now = new Date()) {
  const link = await db
    .selectFrom("supplement_links as k")
    .leftJoin("supplement_link_uses as u", "u.link_id", "k.id")
    .select([
      "k.id",
      "k.shop_id as shopId",
      "k.supplement_id as supplementId",
      "k.customer_id as customerId",
      "k.expires_at as expiresAt",
      "u.used_at as usedAt",
    ])
    .where("k.token_sha256", "=", tokenHash(token))
    .executeTakeFirst();
  if (!link) return { kind: "unknown" as const };
  if (link.usedAt) return { kind: "used" as const, at: link.usedAt, ...link };
  if (link.expiresAt.getTime() <= now.getTime()) return { kind: "expired" as const, at: link.expiresAt, ...link };
  return { kind: "open" as const, ...link };
}

/** Why a link cannot be used, in plain words (null: it can). `signedInCustomerId`: the visitor's own customer, when signed in as one. */
export function linkRefusal(state: Awaited<ReturnType<typeof linkState>>, signedInCustomerId: string | null): Refusal | null {
  if (state.kind === "unknown") return new Refusal("This link is not one we sent (it may be cut short); nothing was changed.", 404);
  if (signedInCustomerId && signedInCustomerId !== state.customerId)
    return new Refusal("This link was sent to another customer; nothing was changed. Sign out, or answer on your own page.", 403);
  if (state.kind === "used")
    return new Refusal(`This link was already used on ${formatDay(state.at)}; nothing was changed. Your answers are on your page.`, 409);
  if (state.kind === "expired")
    return new Refusal(
      `This link expired on ${formatDay(state.at)}; nothing was changed. Sign in to answer, or ask us for a new link.`,
      409,
    );
  return null;
}

/** Answers through an e-mailed link: the link is used once, and only while it is open and for its own customer. */
export async function answerByLink(
  db: Kysely<Database>,
  token: string,
  input: DecisionsInput,
  signedInCustomerId: string | null,
  now = new Date(),
) {
  const state = await linkState(db, token, now);
  const refused = linkRefusal(state, signedInCustomerId);
  if (refused || state.kind !== "open") {
    await appendAudit(db, [
      {
        shopId: state.kind === "unknown" ? null : state.shopId,
        actorId: null,
        action: "supplement.answer",
        entity: "supplement",
        entityId: state.kind === "unknown" ? null : state.supplementId,
        outcome: "refused",
        reason: `link ${state.kind}${signedInCustomerId && state.kind !== "unknown" && signedInCustomerId !== state.customerId ? ", another customer" : ""}`,
      },
    ]);
    throw refused!;
  }
  return db.transaction().execute(async (trx) => {
    // the bike must still be this customer's
    const owner = await trx
      .selectFrom("supplements as s")
      .innerJoin("work_orders as w", "w.id", "s.work_order_id")
      .innerJoin("bikes as b", "b.id", "w.bike_id")
      .select("b.customer_id as customerId")
      .where("s.id", "=", state.supplementId)
      .forUpdate("w")
      .executeTakeFirstOrThrow();
    if (owner.customerId !== state.customerId) throw new Refusal("This link was sent to another customer; nothing was changed.", 403);
    const used = await trx
      .insertInto("supplement_link_uses")
      .values({ link_id: state.id })
      .onConflict((oc) => oc.column("link_id").doNothing())
      .returning("link_id")
      .executeTakeFirst();
    if (!used) throw new Refusal("This link was already used; nothing was changed. Your answers are on your page.", 409);
    return recordAnswers(trx, state.supplementId, input, { userId: null, linkId: state.id });
  });
}

/** The supplements of a work order, oldest first, with lines, answers and photos (office and customer). */
export async function supplementsOf(db: Db, workOrderIds: readonly string[]) {
  if (!workOrderIds.length) return [];
  const sups = await db
    .selectFrom("supplements as s")
    .leftJoin("users as u", "u.id", "s.created_by")
    .select([
      "s.id",
      "s.work_order_id as workOrderId",
      "s.number",
      "s.finding",
      "s.currency",
      "s.created_at as createdAt",
      "u.name as writtenBy",
    ])
    .where("s.work_order_id", "=", sql<string>`ANY(${workOrderIds}::uuid[])`)
    .orderBy("s.number")
    .execute();
  if (!sups.length) return [];
  const ids = sups.map((s) => s.id);
  const [lines, photos] = await Promise.all([
    db
      .selectFrom("supplement_lines as l")
      .leftJoin("supplement_decisions as d", "d.supplement_line_id", "l.id")
      .leftJoin("users as u", "u.id", "d.decided_by")
      .select([
        "l.id",
        "l.supplement_id as supplementId",
        "l.position",
        "l.kind",
        "l.description",
        "l.part_number as partNumber",
        "l.quantity_hundredths as quantityHundredths",
        "l.unit_price_minor as unitPriceMinor",
        "l.line_total_minor as lineTotalMinor",
        "d.decision",
        "d.comment",
        "d.decided_at as decidedAt",
        "u.name as decidedBy",
        "d.supplement_link_id as linkId",
      ])
      .where("l.supplement_id", "=", sql<string>`ANY(${ids}::uuid[])`)
      .orderBy("l.position")
      .execute(),
    db
      .selectFrom("supplement_photos as p")
      .innerJoin("attachments as a", "a.id", "p.attachment_id")
      .select(["p.supplement_id as supplementId", "a.id", "a.caption"])
      .where("p.supplement_id", "=", sql<string>`ANY(${ids}::uuid[])`)
      .execute(),
  ]);
  return sups.map((s) => ({
    ...s,
    lines: lines
      .filter((l) => l.supplementId === s.id)
      .map(({ supplementId: _s, decision, comment, decidedAt, decidedBy, linkId, ...l }) => ({
        ...l,
        answer: decision
          ? {
              decision,
              comment: comment ?? "",
              at: decidedAt!,
              by: decidedBy ?? (linkId ? "the customer, by the e-mailed link" : "the customer"),
            }
          : null,
      })),
    photos: photos.filter((p) => p.supplementId === s.id).map((p) => ({ id: p.id, caption: p.caption })),
  }));
}

export type SupplementView = Awaited<ReturnType<typeof supplementsOf>>[number];

/** A photo shown with extra work on the customer's own bike (null: not theirs, or not shown with extra work). */
export async function extraWorkPhotoForCustomer(
  db: Kysely<Database>,
  user: { shopId: string; customerId: string | null },
  attachmentId: string,
) {
  return db
    .selectFrom("supplement_photos as p")
    .innerJoin("supplements as s", "s.id", "p.supplement_id")
    .innerJoin("work_orders as w", "w.id", "s.work_order_id")
    .innerJoin("bikes as b", "b.id", "w.bike_id")
    .innerJoin("attachments as a", "a.id", "p.attachment_id")
    .select(["a.object_key as objectKey", "a.content_type as contentType"])
    .where("p.attachment_id", "=", attachmentId)
    .where("s.shop_id", "=", user.shopId)
    .where("b.customer_id", "=", user.customerId ?? "00000000-0000-0000-0000-000000000000")
    .executeTakeFirst();
}

/** The work order a supplement belongs to. */
export async function supplementWorkOrder(db: Kysely<Database>, supplementId: string): Promise<string> {
  return (await db.selectFrom("supplements").select("work_order_id").where("id", "=", supplementId).executeTakeFirstOrThrow())
    .work_order_id;
}
