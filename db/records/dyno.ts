import "server-only";
import { sql, type Kysely } from "kysely";
import { CHANNEL_IDS, type ChannelId, type DynoRunInput, type RunWithdrawalInput, type StoredDynoRun } from "@/lib/dyno";
import { CHECK_THE_FIELDS, Refusal } from "@/lib/errors";
import { appendAudit } from "../audit/append";
import { DYNO_STATUSES, isClosed } from "@/lib/work-orders/status";
import { closedRecordRefusal } from "@/lib/work-orders/closed-record";
import { mayRecordRun, NOT_YOUR_RUN } from "@/lib/dyno/run-permission";
import type { Database } from "../schema";
import { workOrdersWithBike } from "../shop/work-orders";

// Dyno runs by work order. Every query is scoped by the signed-in user's shop.

/** The dyno_points column of each logged channel. */
const CHANNEL_COLUMNS = {
  mixture: "mixture",
  boost: "boost",
  chargePressure: "charge_pressure",
  iatBeforeCooler: "iat_before_cooler",
  iatAfterCooler: "iat_after_cooler",
  ignition: "ignition",
  knockRetard: "knock_retard",
  roadSpeed: "road_speed",
  gear: "gear",
} as const satisfies Record<ChannelId, string>;

/** The work order with its bike and customer, or null when it is not this shop's. */
export async function findDynoWorkOrder(db: Kysely<Database>, shopId: string, workOrderId: string) {
  const row = await workOrdersWithBike(db)
    .select([
      "w.id",
      "w.number",
      "w.title",
      "w.status",
      "b.make",
      "b.model",
      "b.year",
      "b.tag_code as tagCode",
      "b.displacement_cc as displacementCc",
      "b.customer_id as customerId",
      "c.name as customerName",
    ])
    .where("w.shop_id", "=", shopId)
    .where("w.id", "=", workOrderId)
    .executeTakeFirst();
  return row ?? null;
}

/** Work orders a dyno run may be recorded on (on the bench or later), with their run counts. */
export async function listDynoWorkOrders(db: Kysely<Database>, shopId: string) {
  return db
    .selectFrom("work_orders as w")
    .innerJoin("bikes as b", "b.id", "w.bike_id")
    .select((eb) => [
      "w.id",
      "w.number",
      "w.title",
      "w.status",
      "b.make",
      "b.model",
      "b.tag_code as tagCode",
      eb
        .selectFrom("dyno_runs as r")
        .select(eb.fn.countAll<number>().as("n"))
        .whereRef("r.work_order_id", "=", "w.id")
        .where("r.withdrawn_at", "is", null)
        .as("runCount"),
    ])
    .where("w.shop_id", "=", shopId)
    .where("w.status", "in", DYNO_STATUSES)
    .orderBy("w.number", "desc")
    .execute();
}

/** A work order's runs, oldest first, with their points (numbers parsed, units as stored); withdrawn ones included and marked. */
export async function listDynoRuns(db: Kysely<Database>, shopId: string, workOrderId: string): Promise<StoredDynoRun[]> {
  const runs = await db
    .selectFrom("dyno_runs as r")
    .leftJoin("users as wu", "wu.id", "r.withdrawn_by")
    .leftJoin("tune_versions as tv", "tv.id", "r.tune_version_id")
    .select([
      "r.fuel",
      "tv.id as tuneId",
      "tv.label as tuneLabel",
      "tv.sha256 as tuneSha256",
      "r.id",
      "r.label",
      sql<string>`r.ran_on::text`.as("ranOn"),
      "r.boost_target",
      "r.boost_unit",
      "r.pressure_kpa",
      "r.temperature_c",
      "r.humidity_percent",
      "r.correction_standard",
      "r.torque_unit",
      "r.notes",
      "r.withdrawn_at",
      "r.withdrawn_reason",
      "wu.name as withdrawnByName",
    ])
    .where("r.shop_id", "=", shopId)
    .where("r.work_order_id", "=", workOrderId)
    .orderBy("r.ran_on")
    .orderBy("r.created_at")
    .execute();
  if (runs.length === 0) return [];
  const runIds = runs.map((r) => r.id);
  const points = await db
    .selectFrom("dyno_points")
    .select(["run_id", "rpm", "torque", ...Object.values(CHANNEL_COLUMNS)])
    .where("run_id", "in", runIds)
    .orderBy("run_id")
    .orderBy("position")
    .execute();
  const channels = await db
    .selectFrom("dyno_run_channels")
    .select(["run_id", "channel", "unit", "source_column"])
    .where("run_id", "in", runIds)
    .execute();
  return runs.map((r) => {
    const logged = channels.filter((c) => c.run_id === r.id);
    const order = (c: { channel: ChannelId }) => CHANNEL_IDS.indexOf(c.channel);
    return {
      id: r.id,
      label: r.label,
      ranOn: r.ranOn,
      boostTarget: Number(r.boost_target),
      boostUnit: r.boost_unit,
      pressureKpa: Number(r.pressure_kpa),
      temperatureC: Number(r.temperature_c),
      humidityPercent: Number(r.humidity_percent),
      standard: r.correction_standard,
      torqueUnit: r.torque_unit,
      notes: r.notes,
      fuel: r.fuel,
      tune: r.tuneId && r.tuneLabel && r.tuneSha256 ? { id: r.tuneId, label: r.tuneLabel, sha256: r.tuneSha256 } : null,
      channels: logged
        .map((c) => ({ channel: c.channel, unit: c.unit, sourceColumn: c.source_column }))
        .sort((a, b) => order(a) - order(b)),
      points: points
        .filter((p) => p.run_id === r.id)
        .map((p) => {
          const point = { rpm: Number(p.rpm), torque: Number(p.torque) };
          if (logged.length === 0) return point;
          const values: Partial<Record<ChannelId, number>> = {};
          for (const c of logged) {
            const v = p[CHANNEL_COLUMNS[c.channel]];
            if (v !== null) values[c.channel] = Number(v);
          }
          return { ...point, logged: values };
        }),
      withdrawn:
        r.withdrawn_at && r.withdrawn_reason
          ? { at: r.withdrawn_at.toISOString(), byName: r.withdrawnByName, reason: r.withdrawn_reason }
          : null,
    };
  });
}

/** A checked run to store; a run typed in or from our own curve file has no channels, fuel or tune. */
type RunToSave = Omit<DynoRunInput, "channels" | "fuel" | "tuneVersionId"> &
  Partial<Pick<DynoRunInput, "channels" | "fuel" | "tuneVersionId">>;

/**
 * Stores a checked run, its points and its logged channels in one transaction (all or nothing),
 * with its audit entry. Refused (409, with the audit entry) once the job's record is closed, and
 * (403) when `userId` is not the job's mechanic, a supervisor or the office
 * (lib/dyno/run-permission.ts); a tune that is not one of the work order's tune versions is refused
 * (400, field tuneVersionId). Returns the new id, or null when the work order is not this shop's.
 */
export async function saveDynoRun(
  db: Kysely<Database>,
  shopId: string,
  workOrderId: string,
  userId: string | null,
  run: RunToSave,
): Promise<string | null> {
  const result = await db.transaction().execute(async (trx) => {
    const job = await trx
      .selectFrom("work_orders")
      .select(["id", "number", "status", "assigned_mechanic_id"])
      .where("shop_id", "=", shopId)
      .where("id", "=", workOrderId)
      .forShare()
      .executeTakeFirst();
    if (!job) return null;
    const audit = { shopId, actorId: userId, action: "dyno.run-recorded", entity: "dyno_run", workOrderId };
    const user = userId
      ? await trx.selectFrom("users").select(["id", "shop_id as shopId", "role"]).where("id", "=", userId).executeTakeFirst()
      : undefined;
    const refusal =
      closedRecordRefusal(job, "dyno run") ??
      (user && !mayRecordRun(user, { shopId, assignedMechanicId: job.assigned_mechanic_id }) ? NOT_YOUR_RUN : null);
    if (refusal) {
      await appendAudit(trx, [{ ...audit, outcome: "refused", reason: refusal, detail: { label: run.label, ranOn: run.ranOn } }]);
      return { ok: false as const, refused: refusal, status: refusal === NOT_YOUR_RUN ? (403 as const) : (409 as const) };
    }
    const tuneVersionId = run.tuneVersionId ?? null;
    if (run.tuneVersionId === undefined) {
      const anyTune = await trx.selectFrom("tune_versions").select("id").where("work_order_id", "=", workOrderId).executeTakeFirst();
      if (anyTune) {
        throw new Refusal(CHECK_THE_FIELDS, 400, [
          { path: "tuneVersionId", message: "Say which tune the run was made on: this work order has tune versions (or choose none)." },
        ]);
      }
    }
    if (tuneVersionId !== null) {
      const tune = await trx
        .selectFrom("tune_versions")
        .select("id")
        .where("shop_id", "=", shopId)
        .where("work_order_id", "=", workOrderId)
        .where("id", "=", tuneVersionId)
        .executeTakeFirst();
      if (!tune) {
        throw new Refusal(CHECK_THE_FIELDS, 400, [
          { path: "tuneVersionId", message: "That tune is not one of this work order's tune versions." },
        ]);
      }
    }
    const { id } = await trx
      .insertInto("dyno_runs")
      .values({
        shop_id: shopId,
        work_order_id: workOrderId,
        label: run.label,
        ran_on: run.ranOn,
        boost_target: run.boostTarget,
        boost_unit: run.boostUnit,
        pressure_kpa: run.pressureKpa,
        temperature_c: run.temperatureC,
        humidity_percent: run.humidityPercent,
        correction_standard: run.standard,
        torque_unit: run.torqueUnit,
        notes: run.notes,
        source: run.source,
        created_by: userId,
        fuel: run.fuel ?? null,
        tune_version_id: tuneVersionId,
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    await trx
      .insertInto("dyno_points")
      .values(
        run.points.map((p, position) => {
          const row = { run_id: id, position, rpm: p.rpm, torque: p.torque };
          if (!p.logged) return row;
          const values: Partial<Record<(typeof CHANNEL_COLUMNS)[ChannelId], number>> = {};
          for (const channel of CHANNEL_IDS) {
            const v = p.logged[channel];
            if (v !== undefined) values[CHANNEL_COLUMNS[channel]] = v;
          }
          return { ...row, ...values };
        }),
      )
      .execute();
    const channels = run.channels ?? [];
    if (channels.length) {
      await trx
        .insertInto("dyno_run_channels")
        .values(channels.map((c) => ({ run_id: id, channel: c.channel, unit: c.unit, source_column: c.sourceColumn })))
        .execute();
    }
    await appendAudit(trx, [
      {
        ...audit,
        entityId: id,
        outcome: "accepted",
        detail: { label: run.label, ranOn: run.ranOn, source: run.source, points: run.points.length, standard: run.standard },
      },
    ]);
    return { ok: true as const, id };
  });
  if (!result) return null;
  if (!result.ok) throw new Refusal(result.refused, result.status);
  return result.id;
}

type WithdrawRunResult = { ok: true; runId: string; closedJob: boolean } | { ok: false; status: 404 | 409; reason: string };

/**
 * Withdraws a run of the work order (see lib/dyno/run-withdrawal.ts), with the audit entry, in one
 * transaction. A run already withdrawn stays as it was (409): the first withdrawal stands.
 */
export async function withdrawDynoRun(
  db: Kysely<Database>,
  user: { id: string; shopId: string },
  workOrderId: string,
  runId: string,
  input: RunWithdrawalInput,
): Promise<WithdrawRunResult> {
  return db.transaction().execute(async (trx) => {
    const run = await trx
      .selectFrom("dyno_runs")
      .select(["id", "label", "withdrawn_at"])
      .where("shop_id", "=", user.shopId)
      .where("work_order_id", "=", workOrderId)
      .where("id", "=", runId)
      .forUpdate()
      .executeTakeFirst();
    if (!run) return { ok: false, status: 404, reason: "No such dyno run on this work order." };
    const audit = {
      shopId: user.shopId,
      actorId: user.id,
      action: "dyno.run-withdrawn",
      entity: "dyno_run",
      entityId: run.id,
      workOrderId,
      reason: input.reason,
    };
    if (run.withdrawn_at) {
      await appendAudit(trx, [{ ...audit, outcome: "refused", detail: { label: run.label, why: "already withdrawn" } }]);
      return { ok: false, status: 409, reason: "This run was already withdrawn." };
    }
    await trx
      .updateTable("dyno_runs")
      .set({ withdrawn_at: sql<Date>`now()`, withdrawn_by: user.id, withdrawn_reason: input.reason })
      .where("id", "=", run.id)
      .execute();
    await appendAudit(trx, [{ ...audit, outcome: "accepted", detail: { label: run.label } }]);
    const job = await trx.selectFrom("work_orders").select("status").where("id", "=", workOrderId).executeTakeFirstOrThrow();
    return { ok: true, runId: run.id, closedJob: isClosed(job.status) };
  });
}
