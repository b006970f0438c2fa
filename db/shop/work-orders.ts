import "server-only";
import { sql, type ExpressionBuilder, type Kysely, type Transaction } from "kysely";
import { readyToGoInBuild } from "@/lib/office/deposit-notice";
import { intakeSchema, type IntakeInput } from "@/lib/office/schemas";
import { Refusal } from "@/lib/errors";
import { checkTransition, isGatedMove, type OverrideRequest } from "@/lib/work-orders/transition-rules";
import { openItemLine, openItemsSummary } from "@/lib/work-orders/open-items";
import { heldOfDeposits } from "../office/deposits";
import type { FieldIssue } from "@/lib/errors";
import { CLOSED_STATUSES, isClosed, STATUS_LABELS, type WorkOrderStatus } from "@/lib/work-orders/status";
import { appendAudit, type AuditEntry } from "../audit/append";
import type { Database } from "../schema";
import { partsOfWorkOrder } from "../records/parts-fitted";
import { loadOpenItems } from "../records/open-items";
import { withOpenRecord } from "./open-record";
import { withdrawnEntries } from "../records/withdrawn-entries";
import { cancelBookingsOfClosedJob } from "../calendar/bookings";
import { releaseReservationsOfClosedJob } from "../stock/reserve";
import { containsPattern } from "./search";
import type { PageOpts } from "./customers";

type Trx = Transaction<Database>;

// Work orders joined to their bike (b), its owner (c) and the assigned mechanic (m, may be null):
// the starting point of every page that shows a job with its bike. Callers add the shop filter.
export function workOrdersWithBike(db: Kysely<Database>) {
  return db
    .selectFrom("work_orders as w")
    .innerJoin("bikes as b", "b.id", "w.bike_id")
    .innerJoin("customers as c", "c.id", "b.customer_id")
    .leftJoin("users as m", "m.id", "w.assigned_mechanic_id");
}

/** The approved quote's deposit and what has been paid on it, per work order (`w`): the deposit notice reads them. */
function depositColumns(eb: ExpressionBuilder<Database & { w: Database["work_orders"] }, "w">) {
  const approved = eb
    .selectFrom("quotes as aq")
    .select("aq.id")
    .whereRef("aq.work_order_id", "=", "w.id")
    .where("aq.status", "=", "approved")
    .orderBy("aq.version", "desc")
    .limit(1);
  return [
    eb
      .selectFrom("quotes as dq")
      .select("dq.deposit_minor")
      .whereRef("dq.work_order_id", "=", "w.id")
      .where("dq.status", "=", "approved")
      .orderBy("dq.version", "desc")
      .limit(1)
      .as("depositDueMinor"),
    eb
      .selectFrom("deposits as d")
      .select(heldOfDeposits("d").as("paid"))
      .where("d.quote_id", "=", approved)
      .where("d.status", "=", "paid")
      .as("depositPaidMinor"),
    eb
      .selectFrom("deposits as d")
      .select((sub) => sub.fn.max("d.paid_at").as("at"))
      .where("d.quote_id", "=", approved)
      .where("d.status", "=", "paid")
      .as("depositPaidAt"),
  ] as const;
}

/** The deposit notice of one row with depositColumns: ready to go into build, and since when. */
function withDepositNotice<R extends { status: WorkOrderStatus; depositDueMinor: number | null; depositPaidMinor: number | string | null }>(
  r: R,
) {
  const depositPaidMinor = Number(r.depositPaidMinor ?? 0);
  return {
    ...r,
    depositPaidMinor,
    readyForBuild: readyToGoInBuild({ status: r.status, depositDueMinor: r.depositDueMinor, depositPaidMinor }),
  };
}

const SORTS = { number: "w.number", updated: "w.updated_at", status: "w.status", customer: "c.name", tag: "b.tag_code" } as const;

export async function pageWorkOrders(db: Kysely<Database>, shopId: string, o: PageOpts & { status?: WorkOrderStatus }) {
  let base = workOrdersWithBike(db).where("w.shop_id", "=", shopId);
  if (o.status) base = base.where("w.status", "=", o.status);
  if (o.q) {
    const like = containsPattern(o.q);
    base = base.where((eb) =>
      eb.or([
        eb("w.title", "ilike", like),
        eb("b.tag_code", "ilike", like),
        eb("c.name", "ilike", like),
        eb("b.make", "ilike", like),
        eb("b.model", "ilike", like),
        eb(sql<string>`w.number::text`, "=", o.q),
      ]),
    );
  }
  const { n } = await base.select((eb) => eb.fn.countAll<number>().as("n")).executeTakeFirstOrThrow();
  const rows = await base
    .select([
      "w.id",
      "w.number",
      "w.title",
      "w.status",
      "w.updated_at as updatedAt",
      "b.id as bikeId",
      "b.make",
      "b.model",
      "b.tag_code as tagCode",
      "c.name as customerName",
      "m.name as mechanicName",
    ])
    .select((eb) => depositColumns(eb))
    .orderBy(sql.ref(Object.hasOwn(SORTS, o.sort) ? SORTS[o.sort as keyof typeof SORTS] : "w.number"), o.dir)
    .orderBy("w.id")
    .limit(o.size)
    .offset(o.page * o.size)
    .execute();
  return { total: Number(n), rows: rows.map(withDepositNotice) };
}

// Books a bike in: a new work order numbered after the shop's last, its first transition and
// the intake note, in one transaction.
export async function bookIn(db: Kysely<Database>, shopId: string, userId: string, input: IntakeInput) {
  const i = intakeSchema.parse(input);
  return db.transaction().execute((trx) => bookInWith(trx, shopId, userId, i));
}

/** bookIn inside the caller's transaction (a come-back books the bike in with its link in one transaction). */
export async function bookInWith(trx: Trx, shopId: string, userId: string, i: ReturnType<typeof intakeSchema.parse>) {
  const bike = await trx.selectFrom("bikes").select("id").where("id", "=", i.bikeId).where("shop_id", "=", shopId).executeTakeFirst();
  if (!bike) throw new Refusal("Choose a bike from this shop.", 422, [{ path: "bikeId", message: "unknown bike" }]);
  // the shop's row is held from here: a second booking-in of the same bike at once waits, then finds
  // this one open (and the job numbers are given one at a time)
  await trx.selectFrom("shops").select("id").where("id", "=", shopId).forUpdate().execute();
  const open = await trx
    .selectFrom("work_orders")
    .select("number")
    .where("bike_id", "=", i.bikeId)
    .where("status", "not in", CLOSED_STATUSES)
    .executeTakeFirst();
  if (open)
    throw new Refusal(`This bike already has an open work order (#${open.number}).`, 409, [
      { path: "bikeId", message: `work order #${open.number} is still open` },
    ]);
  const last = await trx
    .selectFrom("work_orders")
    .select((eb) => eb.fn.max("number").as("n"))
    .where("shop_id", "=", shopId)
    .executeTakeFirst();
  const number = (last?.n ?? 1000) + 1;
  const wo = await trx
    .insertInto("work_orders")
    .values({
      shop_id: shopId,
      bike_id: i.bikeId,
      number,
      title: i.title,
      status: "booked_in",
      complaint: i.complaint,
      intake_odometer_km: i.odometerKm,
      assigned_mechanic_id: null,
      closed_at: null,
    })
    .returning(["id", "number"])
    .executeTakeFirstOrThrow();
  await trx
    .insertInto("work_order_transitions")
    .values({ work_order_id: wo.id, from_status: null, to_status: "booked_in", by_user_id: userId, note: "booked in" })
    .execute();
  const note = await trx
    .insertInto("work_order_notes")
    .values({ shop_id: shopId, work_order_id: wo.id, kind: "intake", body: i.complaint, author_id: userId })
    .returning("id")
    .executeTakeFirstOrThrow();
  await appendAudit(trx, [
    {
      shopId,
      actorId: userId,
      action: "work_order.book_in",
      entity: "work_order",
      entityId: wo.id,
      workOrderId: wo.id,
      outcome: "accepted",
      detail: { number, odometerKm: i.odometerKm },
    },
  ]);
  return { ...wo, intakeNoteId: note.id };
}

/** The shop's work order, locked for a change inside the caller's transaction; 404 when the shop has none by that id. */
export async function lockWorkOrder(trx: Trx, shopId: string, id: string) {
  const wo = await trx
    .selectFrom("work_orders")
    .select(["id", "status", "assigned_mechanic_id as mechanicId", "number"])
    .where("id", "=", id)
    .where("shop_id", "=", shopId)
    .forUpdate()
    .executeTakeFirst();
  if (!wo) throw new Refusal("No such work order in this shop.", 404);
  return wo;
}

// The facts checkTransition needs, read inside the caller's transaction.
async function transitionFacts(trx: Trx, workOrderId: string) {
  const quote = await trx
    .selectFrom("quotes")
    .select(["id", "status", "deposit_minor as depositMinor"])
    .where("work_order_id", "=", workOrderId)
    .where("status", "in", ["sent", "approved"])
    .orderBy("version", "desc")
    .executeTakeFirst();
  const paid = quote
    ? await trx
        .selectFrom("deposits")
        // what is still held of each paid deposit: a part refunded at the provider is not paid
        .select(heldOfDeposits().as("s"))
        .where("quote_id", "=", quote.id)
        .where("status", "=", "paid")
        .executeTakeFirstOrThrow()
    : { s: 0 };
  const pinned = await trx
    .selectFrom("job_procedures")
    .select((eb) => eb.fn.countAll<number>().as("n"))
    .where("work_order_id", "=", workOrderId)
    .executeTakeFirstOrThrow();
  return {
    sentQuote: Boolean(quote),
    approvedQuote: quote?.status === "approved",
    depositDueMinor: quote?.status === "approved" ? quote.depositMinor : 0,
    depositPaidMinor: Number(paid.s),
    proceduresPinned: Number(pinned.n),
  };
}

/** A move refused inside the caller's transaction: the caller writes `audit` once it has rolled back. */
export class MoveRefusal extends Refusal {
  constructor(
    message: string,
    issues: FieldIssue[],
    readonly audit: AuditEntry[],
  ) {
    super(message, 409, issues);
  }
}

// Moves a work order to `to` when the flow and the shop's rules allow, recording who and when;
// otherwise refuses with the reason (and writes the refusal to the audit log). The moves to
// "ready" and "handed over" are gated on the record (lib/work-orders/open-items.ts): they run under
// the shop's sync lock, so no bench entry or review decision lands between the check and the move,
// and go through with items open only with the office's override, which is recorded with the
// reason and the items open at that moment (status_overrides, audit "work_order.override").
export async function moveWorkOrder(
  db: Kysely<Database> | Trx,
  shopId: string,
  userId: string,
  workOrderId: string,
  to: WorkOrderStatus,
  opts: { note?: string; templateVersionIds?: string[]; byCustomerApproval?: boolean; override?: OverrideRequest | null } = {},
): Promise<{ from: WorkOrderStatus; to: WorkOrderStatus; overrideId: string | null }> {
  const run = async (trx: Trx) => {
    if (isGatedMove(to)) await sql`SELECT benchtag_lock_shop_sync(${shopId}::uuid)`.execute(trx);
    const wo = await lockWorkOrder(trx, shopId, workOrderId);
    const facts = await transitionFacts(trx, workOrderId);
    const toPin = opts.templateVersionIds ?? [];
    if (toPin.length) {
      const ok = await trx
        .selectFrom("template_versions as v")
        .innerJoin("procedure_templates as t", "t.id", "v.template_id")
        .select(["v.id", "t.name", "v.version"])
        .where("v.id", "in", toPin)
        .where("t.shop_id", "=", shopId)
        .execute();
      if (ok.length !== new Set(toPin).size) throw new Refusal("One of the chosen templates is not in this shop.", 422);
      // one version pinned once on a job: the bench keys its work by step, so a second copy of the
      // same steps would read as done by the first copy's work, with nothing done on it
      const name = (id: string) => {
        const v = ok.find((x) => x.id === id)!;
        return `“${v.name}” (version ${v.version})`;
      };
      const twice = toPin.find((id, i) => toPin.indexOf(id) !== i);
      if (twice) {
        const message = `${name(twice)} is chosen twice: pin each procedure once.`;
        throw new Refusal(message, 422, [{ path: "templateVersionIds", message }]);
      }
      const already = await trx
        .selectFrom("job_procedures")
        .select("template_version_id as id")
        .where("work_order_id", "=", workOrderId)
        .where("template_version_id", "in", toPin)
        .executeTakeFirst();
      if (already) {
        const message = `${name(already.id)} is already pinned on this job: its steps are on the bench already.`;
        throw new Refusal(message, 422, [{ path: "templateVersionIds", message }]);
      }
    }
    const open = isGatedMove(to) ? ((await loadOpenItems(trx, shopId, workOrderId)) ?? undefined) : undefined;
    const check = checkTransition(wo.status, to, {
      ...facts,
      mechanicAssigned: Boolean(wo.mechanicId),
      proceduresPinned: facts.proceduresPinned + toPin.length,
      byCustomerApproval: opts.byCustomerApproval,
      openItems: open,
      override: opts.override ?? null,
    });
    if (!check.ok) return { refused: check.reason, issues: check.issues ?? [], from: wo.status, open, overrideId: null };
    const position0 = facts.proceduresPinned;
    for (const [i, versionId] of toPin.entries()) {
      await trx
        .insertInto("job_procedures")
        .values({ work_order_id: workOrderId, template_version_id: versionId, position: position0 + i })
        .execute();
    }
    await trx
      .updateTable("work_orders")
      .set({ status: to, updated_at: sql`now()`, closed_at: isClosed(to) ? new Date() : null })
      .where("id", "=", workOrderId)
      .execute();
    if (isClosed(to)) {
      // a closed job holds no shelf stock and no slot still to come
      const why = `Job #${wo.number} ${STATUS_LABELS[to].toLowerCase()}: let go when it closed.`;
      await releaseReservationsOfClosedJob(trx, { shopId, userId }, { id: workOrderId, number: wo.number }, why);
      await cancelBookingsOfClosedJob(trx, { shopId, userId }, workOrderId, why);
    }
    const transition = await trx
      .insertInto("work_order_transitions")
      .values({ work_order_id: workOrderId, from_status: wo.status, to_status: to, by_user_id: userId, note: opts.note ?? "" })
      .returning("id")
      .executeTakeFirstOrThrow();
    let overrideId: string | null = null;
    if (check.overridden && opts.override && open) {
      const saved = await trx
        .insertInto("status_overrides")
        .values({
          shop_id: shopId,
          work_order_id: workOrderId,
          transition_id: transition.id,
          from_status: wo.status,
          to_status: to as "ready" | "handed_over",
          reason: opts.override.reason,
          open_items: JSON.stringify(open),
          by_user_id: userId,
        })
        .returning("id")
        .executeTakeFirstOrThrow();
      overrideId = saved.id;
    }
    await appendAudit(trx, [
      {
        shopId,
        actorId: userId,
        action: "work_order.move",
        entity: "work_order",
        entityId: workOrderId,
        workOrderId,
        outcome: "accepted",
        detail: { from: wo.status, to, pinned: toPin, overrideId },
      },
      ...(overrideId && opts.override && open
        ? [
            {
              shopId,
              actorId: userId,
              action: "work_order.override",
              entity: "status_override",
              entityId: overrideId,
              workOrderId,
              outcome: "accepted" as const,
              reason: opts.override.reason,
              detail: { from: wo.status, to, openItems: open.map(openItemLine), summary: openItemsSummary(open) },
            },
          ]
        : []),
    ]);
    return { refused: null, issues: [] as FieldIssue[], from: wo.status, open, overrideId };
  };
  const inOuterTransaction = "isTransaction" in db && db.isTransaction;
  const result = inOuterTransaction ? await run(db as Trx) : await (db as Kysely<Database>).transaction().execute(run);
  if (result.refused) {
    const audit: AuditEntry[] = [
      {
        shopId,
        actorId: userId,
        action: opts.override ? "work_order.override" : "work_order.move",
        entity: "work_order",
        entityId: workOrderId,
        workOrderId,
        outcome: "refused",
        reason: result.refused,
        detail: {
          from: result.from,
          to,
          ...(result.open?.length ? { openItems: result.open.map(openItemLine) } : {}),
          ...(opts.override ? { overrideReason: opts.override.reason } : {}),
        },
      },
    ];
    // Inside the caller's transaction the entry would be rolled back with it: the caller writes it after.
    if (inOuterTransaction) throw new MoveRefusal(result.refused, result.issues, audit);
    await appendAudit(db, audit);
    throw new Refusal(result.refused, 409, result.issues);
  }
  return { from: result.from, to, overrideId: result.overrideId };
}

/**
 * A move and what must be made in its own transaction (the "ready" e-mail's copy of the report):
 * both or neither. A refusal is audited after the transaction, as moveWorkOrder does on its own.
 */
export async function moveAndMake<R>(
  db: Kysely<Database>,
  shopId: string,
  userId: string,
  workOrderId: string,
  to: WorkOrderStatus,
  opts: { note?: string; override?: OverrideRequest | null },
  make: (trx: Trx) => Promise<R>,
): Promise<{ from: WorkOrderStatus; to: WorkOrderStatus; overrideId: string | null; made: R }> {
  try {
    return await db.transaction().execute(async (trx) => {
      const moved = await moveWorkOrder(trx, shopId, userId, workOrderId, to, opts);
      return { ...moved, made: await make(trx) };
    });
  } catch (e) {
    if (e instanceof MoveRefusal) await appendAudit(db, e.audit);
    throw e;
  }
}

export async function assignMechanic(db: Kysely<Database>, shopId: string, userId: string, workOrderId: string, mechanicId: string | null) {
  if (mechanicId) {
    const m = await db
      .selectFrom("users")
      .select("id")
      .where("id", "=", mechanicId)
      .where("shop_id", "=", shopId)
      .where("role", "in", ["mechanic", "supervisor"])
      .where("active", "=", true)
      .executeTakeFirst();
    if (!m) throw new Refusal("Choose an active mechanic of this shop.", 422, [{ path: "mechanicId", message: "not a mechanic here" }]);
  }
  await withOpenRecord(db, { shopId, userId }, workOrderId, "mechanic assignment", async (trx) => {
    await trx
      .updateTable("work_orders")
      .set({ assigned_mechanic_id: mechanicId, updated_at: sql`now()` })
      .where("id", "=", workOrderId)
      .where("shop_id", "=", shopId)
      .execute();
    await appendAudit(trx, [
      {
        shopId,
        actorId: userId,
        action: "work_order.assign",
        entity: "work_order",
        entityId: workOrderId,
        workOrderId,
        outcome: "accepted",
        detail: { mechanicId },
      },
    ]);
  });
}

export async function workOrderDetail(db: Kysely<Database>, shopId: string, id: string) {
  const wo = await workOrdersWithBike(db)
    .select([
      "w.id",
      "w.number",
      "w.title",
      "w.status",
      "w.complaint",
      "w.intake_odometer_km as odometerKm",
      "w.created_at as createdAt",
      "w.assigned_mechanic_id as mechanicId",
      "m.name as mechanicName",
      "b.id as bikeId",
      "b.make",
      "b.model",
      "b.year",
      "b.tag_code as tagCode",
      "c.id as customerId",
      "c.name as customerName",
      "c.email as customerEmail",
      "c.phone as customerPhone",
    ])
    .select((eb) => depositColumns(eb))
    .where("w.id", "=", id)
    .where("w.shop_id", "=", shopId)
    .executeTakeFirst()
    .then((r) => r && withDepositNotice(r));
  if (!wo) return null;
  const [transitions, notes, photos, procedures, parts, emails, withdrawn] = await Promise.all([
    db
      .selectFrom("work_order_transitions as t")
      .leftJoin("users as u", "u.id", "t.by_user_id")
      .select(["t.id", "t.from_status as from", "t.to_status as to", "t.note", "t.at", "u.name as byName"])
      .where("t.work_order_id", "=", id)
      .orderBy("t.at")
      .orderBy("t.id")
      .execute(),
    db
      .selectFrom("work_order_notes as n")
      .leftJoin("users as u", "u.id", "n.author_id")
      .select(["n.id", "n.kind", "n.body", "n.created_at as at", "u.name as authorName"])
      .where("n.work_order_id", "=", id)
      .where("n.shop_id", "=", shopId)
      .orderBy("n.created_at")
      .execute(),
    db
      .selectFrom("attachments")
      .select(["id", "purpose", "note_id as noteId", "caption", "content_type as contentType", "created_at as at"])
      .where("work_order_id", "=", id)
      .where("shop_id", "=", shopId)
      .orderBy("created_at")
      .execute(),
    db
      .selectFrom("job_procedures as j")
      .innerJoin("template_versions as v", "v.id", "j.template_version_id")
      .innerJoin("procedure_templates as t", "t.id", "v.template_id")
      .select(["j.id", "j.position", "t.key", "v.name", "v.version", "v.id as versionId"])
      .where("j.work_order_id", "=", id)
      .orderBy("j.position")
      .execute(),
    partsOfWorkOrder(db, shopId, id),
    db
      .selectFrom("outbound_emails")
      .select(["id", "kind", "recipient", "subject", "error", "sent_at as at"])
      .where("work_order_id", "=", id)
      .where("shop_id", "=", shopId)
      .orderBy("sent_at")
      .execute(),
    withdrawnEntries(db, shopId, { workOrderId: id }),
  ]);
  return { ...wo, transitions, notes, photos, procedures, parts, emails, withdrawn };
}

/** Whether the work order is one of this shop's. */
export async function workOrderInShop(db: Kysely<Database>, shopId: string, id: string): Promise<boolean> {
  return !!(await db.selectFrom("work_orders").select("id").where("id", "=", id).where("shop_id", "=", shopId).executeTakeFirst());
}

export async function mechanicsOf(db: Kysely<Database>, shopId: string) {
  return db
    .selectFrom("users")
    .select(["id", "name"])
    .where("shop_id", "=", shopId)
    .where("role", "in", ["mechanic", "supervisor"])
    .where("active", "=", true)
    .orderBy("name")
    .execute();
}

export async function addNote(
  db: Kysely<Database>,
  shopId: string,
  userId: string,
  workOrderId: string,
  kind: "intake" | "teardown" | "general",
  body: string,
) {
  return withOpenRecord(db, { shopId, userId }, workOrderId, "note", (trx) =>
    trx
      .insertInto("work_order_notes")
      .values({ shop_id: shopId, work_order_id: workOrderId, kind, body, author_id: userId })
      .returning("id")
      .executeTakeFirstOrThrow(),
  );
}
