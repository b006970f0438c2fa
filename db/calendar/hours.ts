import "server-only";
import type { Kysely } from "kysely";
import type { SessionUser } from "@/lib/auth/session-user";
import type { OpeningHoursInput } from "@/lib/calendar/rules";
import { appendAudit } from "../audit/append";
import type { Database } from "../schema";

// The shop's opening hours, set by the office. New bookings must fit them; bookings already made
// stay as they are (they are records), and the change is in the audit log with before and after.

export async function setOpeningHours(db: Kysely<Database>, user: SessionUser, input: OpeningHoursInput) {
  const openDays = [...input.openDays].sort((a, b) => a - b);
  return db.transaction().execute(async (trx) => {
    const before = await trx
      .selectFrom("shops")
      .select(["opens_at as opensAt", "closes_at as closesAt", "open_days as openDays"])
      .where("id", "=", user.shopId)
      .forUpdate()
      .executeTakeFirstOrThrow();
    await trx
      .updateTable("shops")
      .set({ opens_at: input.opensAt, closes_at: input.closesAt, open_days: openDays })
      .where("id", "=", user.shopId)
      .execute();
    await appendAudit(trx, [
      {
        shopId: user.shopId,
        actorId: user.id,
        action: "shop.opening-hours",
        entity: "shop",
        entityId: user.shopId,
        outcome: "accepted",
        detail: {
          before: { opensAt: before.opensAt.slice(0, 5), closesAt: before.closesAt.slice(0, 5), openDays: before.openDays.map(Number) },
          after: { opensAt: input.opensAt, closesAt: input.closesAt, openDays },
        },
      },
    ]);
    return { opensAt: input.opensAt, closesAt: input.closesAt, openDays };
  });
}
