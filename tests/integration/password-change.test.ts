import { randomUUID } from "node:crypto";
import { describe, expect, it } from "vitest";
import { POST as changePasswordRoute } from "@/app/api/me/password/route";
import { changeOwnPassword, WRONG_CURRENT } from "@/app/_server/password-change";
import { signInWithPassword, SignInRefused } from "@/app/_server/sign-in";
import { userOfSession } from "@/db/auth/sessions";
import { SIGN_IN_WAITS } from "@/lib/auth/sign-in-throttle";
import { Refusal } from "@/lib/errors";
import { appRequest } from "./support/route-calls";
import { createShopFixture, FIXTURE_PASSWORD } from "./support/shop-fixture";
import { useTestDb } from "./support/test-db";

// Changing one's own password (app/_server/password-change.ts, POST /api/me/password): the
// current password is required and its guesses count as wrong sign-ins; the other sessions end.
const db = useTestDb();
const NEW = "a-new-long-password-9";
const addr = () => `198.51.100.${Math.floor(Math.random() * 250)}-${randomUUID().slice(0, 4)}`;
const signIn = async (email: string, password = FIXTURE_PASSWORD, address = addr()) =>
  (await signInWithPassword(db, { email, password }, { address, userAgent: "t" }, { pause: async () => undefined })).sessionId;
const state = async (sid: string) => {
  const r = await userOfSession(db, sid);
  return "user" in r ? "open" : r.refused;
};
const refusalOf = (p: Promise<unknown>) =>
  p.then(
    () => null,
    (e: unknown) => e as Refusal,
  );

describe("changing one's own password", () => {
  it("needs the current password; then the new one signs in, the old one does not, and every other session ends but this one", async () => {
    const fx = await createShopFixture(db);
    const email = fx.users.mechanic.email;
    const here = await signIn(email);
    const [tablet, laptop] = [await signIn(email), await signIn(email)];
    const colleague = await signIn(fx.users.mechanic2.email);
    const client = { address: addr(), userAgent: "t" };

    const wrong = await refusalOf(
      changeOwnPassword(db, { userId: fx.users.mechanic.id, sessionId: here }, { current: "not-it-at-all", password: NEW }, client),
    );
    expect(wrong).toBeInstanceOf(Refusal);
    expect(wrong?.message).toBe(WRONG_CURRENT);
    expect([await state(here), await state(tablet)]).toEqual(["open", "open"]);
    expect(await state(await signIn(email))).toBe("open"); // nothing changed

    const done = await changeOwnPassword(
      db,
      { userId: fx.users.mechanic.id, sessionId: here },
      { current: FIXTURE_PASSWORD, password: NEW },
      client,
    );
    expect(done.sessionsEnded).toBeGreaterThanOrEqual(2);
    // ended as a sign-out ("expired"), not by the office: a tablet keeps its work not yet sent for the next sign-in
    expect([await state(here), await state(tablet), await state(laptop), await state(colleague)]).toEqual([
      "open",
      "expired",
      "expired",
      "open",
    ]);
    await expect(signIn(email)).rejects.toBeInstanceOf(SignInRefused);
    expect(await state(await signIn(email, NEW))).toBe("open");

    const audit = await db
      .selectFrom("audit_log")
      .select(["outcome", "reason"])
      .where("shop_id", "=", fx.shopId)
      .where("action", "=", "user.password-changed")
      .orderBy("id")
      .execute();
    expect(audit).toEqual([
      { outcome: "refused", reason: "wrong current password" },
      { outcome: "accepted", reason: null },
    ]);
  });

  it("guesses at the current password count as wrong sign-ins: after the free ones it waits, even with the right one", async () => {
    const fx = await createShopFixture(db);
    const who = { userId: fx.users.office.id, sessionId: null };
    const client = { address: addr(), userAgent: "t" };
    for (let i = 0; i < SIGN_IN_WAITS.pair.free; i++) {
      expect((await refusalOf(changeOwnPassword(db, who, { current: `guess-${i}-xxxxxx`, password: NEW }, client)))?.message).toBe(
        WRONG_CURRENT,
      );
    }
    const waiting = await refusalOf(changeOwnPassword(db, who, { current: FIXTURE_PASSWORD, password: NEW }, client));
    expect(waiting?.message).toMatch(/^Too many wrong passwords from here\. Wait \d+ seconds?, then try again\.$/);
    // and the sign-in page from that address waits too
    await expect(signIn(fx.users.office.email, FIXTURE_PASSWORD, client.address)).rejects.toThrow(/Too many wrong passwords/);
  });

  it("through the route: the body is checked in workshop words, a cross-site post is refused, and a new password equal to the old one is refused", async () => {
    const fx = await createShopFixture(db);
    const user = { ...fx.users.office, customerId: null };
    const post = (body: unknown, headers: Record<string, string> = {}) =>
      changePasswordRoute.handle(
        appRequest("/api/me/password", {
          method: "POST",
          headers: { "content-type": "application/json", ...headers },
          body: JSON.stringify(body),
        }),
        { user, db },
      );
    const short = await post({ current: FIXTURE_PASSWORD, password: "short", repeat: "short" });
    expect(short.status).toBe(400);
    expect((await short.json()).issues).toEqual([{ path: "password", message: "at least 10 characters" }]);
    const differ = await post({ current: FIXTURE_PASSWORD, password: NEW, repeat: `${NEW}x` });
    expect((await differ.json()).issues).toEqual([{ path: "repeat", message: "the two new passwords differ" }]);
    const same = await post({ current: FIXTURE_PASSWORD, password: FIXTURE_PASSWORD, repeat: FIXTURE_PASSWORD });
    expect(same.status).toBe(400);
    expect((await same.json()).error).toBe("The new password is the one you have now: choose another.");
    const ok = await post({ current: FIXTURE_PASSWORD, password: NEW, repeat: NEW });
    expect(ok.status).toBe(200);
    expect(await ok.json()).toEqual({ changed: true, otherSessionsEnded: 0 });
  });
});
