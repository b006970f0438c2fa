import { randomUUID } from "node:crypto";
import { sql } from "kysely";
import { describe, expect, it } from "vitest";
import { POST as endSessionsRoute } from "@/app/api/office/sessions/route";
import { signInWithPassword } from "@/app/_server/sign-in";
import { endSession, noteSessionDevice, userOfSession } from "@/db/auth/sessions";
import { setUserActive } from "@/db/shop/users";
import { SESSION_IDLE_S } from "@/lib/auth/session-lifetime";
import { appRequest } from "./support/route-calls";
import { createShopFixture, FIXTURE_PASSWORD } from "./support/shop-fixture";
import { useTestDb } from "./support/test-db";

// Server-side sessions (db/auth/sessions.ts): ended on the server, they are refused at once.
const db = useTestDb();
const signIn = async (email: string) =>
  (await signInWithPassword(db, { email, password: FIXTURE_PASSWORD }, { address: `192.0.2.${randomUUID().slice(0, 4)}`, userAgent: "t" }))
    .sessionId;
const state = async (sid: string) => {
  const r = await userOfSession(db, sid);
  return "user" in r ? "open" : r.refused;
};

describe("server-side sessions", () => {
  it("end at sign-out: the same session is refused afterwards", async () => {
    const fx = await createShopFixture(db);
    const sid = await signIn(fx.users.mechanic.email);
    expect(await state(sid)).toBe("open");
    await endSession(db, sid, "signed-out");
    expect(await state(sid)).toBe("expired");
  });

  it("all end when the user is turned off, and turning them on again revives none", async () => {
    const fx = await createShopFixture(db);
    const [a, b] = [await signIn(fx.users.mechanic.email), await signIn(fx.users.mechanic.email)];
    const other = await signIn(fx.users.mechanic2.email);
    await setUserActive(db, fx.shopId, fx.users.office.id, fx.users.mechanic.id, false);
    expect([await state(a), await state(b), await state(other)]).toEqual(["ended", "ended", "open"]);
    await setUserActive(db, fx.shopId, fx.users.office.id, fx.users.mechanic.id, true);
    expect([await state(a), await state(b)]).toEqual(["ended", "ended"]);
    expect(await state(await signIn(fx.users.mechanic.email))).toBe("open");
  });

  it("are ended by the office per person or per tablet, within its own shop only, and audited", async () => {
    const fx = await createShopFixture(db);
    const office = { ...fx.users.office, customerId: null };
    const onTablet = await signIn(fx.users.mechanic.email);
    const sameTabletOtherUser = await signIn(fx.users.supervisor.email);
    const elsewhere = await signIn(fx.users.mechanic2.email);
    const tablet = `tab-${randomUUID().slice(0, 8)}`;
    await noteSessionDevice(db, onTablet, tablet);
    await noteSessionDevice(db, sameTabletOtherUser, tablet);
    const post = (body: unknown, user = office) =>
      endSessionsRoute.handle(
        appRequest("/api/office/sessions", { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(body) }),
        { user, db },
      );
    // another shop's office ends nothing here
    const stranger = await createShopFixture(db);
    expect(await (await post({ deviceId: tablet }, { ...stranger.users.office, customerId: null })).json()).toEqual({ ended: 0 });
    expect(await (await post({ deviceId: tablet })).json()).toEqual({ ended: 2 });
    expect([await state(onTablet), await state(sameTabletOtherUser), await state(elsewhere)]).toEqual(["ended", "ended", "open"]);
    expect(await (await post({ userId: fx.users.mechanic2.id })).json()).toEqual({ ended: 1 });
    expect(await state(elsewhere)).toBe("ended");
    const audit = await db
      .selectFrom("audit_log")
      .select(["action", "entity_id as entityId"])
      .where("shop_id", "=", fx.shopId)
      .where("action", "like", "session.%")
      .orderBy("id")
      .execute();
    expect(audit).toEqual([
      { action: "session.ended-for-tablet", entityId: tablet },
      { action: "session.ended-for-user", entityId: fx.users.mechanic2.id },
    ]);
  });

  it("lapse when idle, slide forward with use, and never pass their absolute end", async () => {
    const fx = await createShopFixture(db);
    const sid = await signIn(fx.users.office.email);
    const row = () => db.selectFrom("sessions").selectAll().where("id", "=", sid).executeTakeFirstOrThrow();
    expect((await row()).idle_seconds).toBe(SESSION_IDLE_S.office);
    // seen five minutes ago, expiring in one: a request slides it to now + 30 min
    await db
      .updateTable("sessions")
      .set({ last_seen_at: sql<Date>`now() - interval '5 minutes'`, expires_at: sql<Date>`now() + interval '1 minute'` })
      .where("id", "=", sid)
      .execute();
    expect(await state(sid)).toBe("open");
    const slid = await row();
    expect(slid.expires_at.getTime() - Date.now()).toBeGreaterThan((SESSION_IDLE_S.office - 60) * 1000);
    // near its absolute end: sliding stops there
    await db
      .updateTable("sessions")
      .set({ last_seen_at: sql<Date>`now() - interval '5 minutes'`, absolute_expires_at: sql<Date>`now() + interval '2 minutes'` })
      .where("id", "=", sid)
      .execute();
    expect(await state(sid)).toBe("open");
    expect((await row()).expires_at.getTime() - Date.now()).toBeLessThan(3 * 60 * 1000);
    // idle past its expiry: refused
    await db
      .updateTable("sessions")
      .set({ expires_at: sql<Date>`now() - interval '1 second'` })
      .where("id", "=", sid)
      .execute();
    expect(await state(sid)).toBe("expired");
  });

  it("give the bench roles a longer idle time than the office", async () => {
    expect(SESSION_IDLE_S.mechanic).toBeGreaterThan(SESSION_IDLE_S.office);
    const fx = await createShopFixture(db);
    const sid = await signIn(fx.users.mechanic.email);
    expect((await db.selectFrom("sessions").select("idle_seconds").where("id", "=", sid).executeTakeFirstOrThrow()).idle_seconds).toBe(
      SESSION_IDLE_S.mechanic,
    );
  });
});
