import "server-only";
import type { Kysely } from "kysely";
import type { SessionUser } from "@/lib/auth/session-user";
import { shortDay, type NewResourceInput, type ResourceKind } from "@/lib/calendar/rules";
import { Refusal } from "@/lib/errors";
import { appendAudit } from "../audit/append";
import type { Database } from "../schema";
import { withKeysHeld } from "../setup/key-locks";
import { bookingsStillToCome } from "./bookings";

// The shop's resources (bays, lifts, the dyno, mechanics). Added once; retired by its own record.

export interface ResourceRow {
  id: string;
  kind: ResourceKind;
  name: string;
  userName: string | null;
  retiredAt: Date | null;
  retiredReason: string | null;
}

export async function listResources(db: Kysely<Database>, shopId: string): Promise<ResourceRow[]> {
  return db
    .selectFrom("shop_resources as r")
    .leftJoin("users as u", "u.id", "r.user_id")
    .leftJoin("resource_retirements as x", "x.resource_id", "r.id")
    .select(["r.id", "r.kind", "r.name", "u.name as userName", "x.retired_at as retiredAt", "x.reason as retiredReason"])
    .where("r.shop_id", "=", shopId)
    .orderBy("r.kind")
    .orderBy("r.name")
    .execute();
}

export async function addResource(db: Kysely<Database>, user: SessionUser, input: NewResourceInput) {
  if (input.userId) {
    const u = await db
      .selectFrom("users")
      .select("role")
      .where("id", "=", input.userId)
      .where("shop_id", "=", user.shopId)
      .executeTakeFirst();
    if (!u || u.role !== "mechanic")
      throw new Refusal("That person is not a mechanic of this shop.", 422, [{ path: "userId", message: "not a mechanic of this shop" }]);
  }
  // the name is checked and written one request at a time: a second "add" at once is refused in words
  return withKeysHeld(db, [`resource-name:${user.shopId}:${input.name}`], async (trx) => {
    const clash = await trx
      .selectFrom("shop_resources")
      .select("id")
      .where("shop_id", "=", user.shopId)
      .where("name", "=", input.name)
      .executeTakeFirst();
    if (clash) throw new Refusal(`The shop already has a resource called ${input.name}.`, 409, [{ path: "name", message: "name taken" }]);
    const row = await trx
      .insertInto("shop_resources")
      .values({ shop_id: user.shopId, kind: input.kind, name: input.name, user_id: input.userId ?? null, created_by: user.id })
      .returning("id")
      .executeTakeFirstOrThrow();
    await appendAudit(trx, [
      {
        shopId: user.shopId,
        actorId: user.id,
        action: "resource.add",
        entity: "shop_resource",
        entityId: row.id,
        outcome: "accepted",
        detail: { kind: input.kind, name: input.name },
      },
    ]);
    return row;
  });
}

/** Retires a resource (once, with the reason) that has no bookings still to come: it can no longer be booked; its past bookings stay on record. */
export async function retireResource(db: Kysely<Database>, user: SessionUser, resourceId: string, reason: string) {
  return db.transaction().execute(async (trx) => {
    const r = await trx
      .selectFrom("shop_resources")
      .select(["id", "name"])
      .where("id", "=", resourceId)
      .where("shop_id", "=", user.shopId)
      .forUpdate()
      .executeTakeFirst();
    if (!r) throw new Refusal("No such resource in this shop.", 404);
    const done = await trx.selectFrom("resource_retirements").select("id").where("resource_id", "=", resourceId).executeTakeFirst();
    if (done) throw new Refusal(`${r.name} is already retired.`, 409);
    // jobs still booked on it would keep a slot on something the shop no longer has: they are moved
    // or cancelled first (each with its reason), so none is silently left without its bay or dyno
    const ahead = await bookingsStillToCome(trx, user.shopId, resourceId);
    if (ahead.length) {
      const list = ahead.map((b) => `job #${b.number}, ${b.from}–${b.to} on ${shortDay(b.day)}`);
      const message = `${r.name} still has ${ahead.length === 1 ? "a booking" : `${ahead.length} bookings`} to come (${list.join("; ")}): book ${ahead.length === 1 ? "that job" : "those jobs"} elsewhere or cancel, then retire it.`;
      throw new Refusal(message, 409, [{ path: "reason", message }]);
    }
    const row = await trx
      .insertInto("resource_retirements")
      .values({ shop_id: user.shopId, resource_id: resourceId, reason, retired_by: user.id })
      .returning(["id", "retired_at as retiredAt"])
      .executeTakeFirstOrThrow();
    await appendAudit(trx, [
      {
        shopId: user.shopId,
        actorId: user.id,
        action: "resource.retire",
        entity: "shop_resource",
        entityId: resourceId,
        outcome: "accepted",
        reason,
      },
    ]);
    return row;
  });
}
