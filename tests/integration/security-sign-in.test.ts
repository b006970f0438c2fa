import { randomUUID } from "node:crypto";
import { describe, expect, it } from "vitest";
import { NO_MATCH, signInWithPassword, SignInRefused } from "@/app/_server/sign-in";
import { signInWaitRows } from "@/app/_server/sign-in-waits";
import { clearSignInBucket } from "@/db/auth/sign-in-waits";
import { bucketKey } from "@/lib/auth/sign-in-throttle";
import { createShopFixture, FIXTURE_PASSWORD } from "./support/shop-fixture";
import { useTestDb } from "./support/test-db";

// Sign-in waits (lib/auth/sign-in-throttle.ts) against real PostgreSQL: a guesser is slowed where
// they are, and the account's owner always gets in with the right password.
const db = useTestDb();
const pauses: number[] = [];
const pause = async (ms: number) => {
  pauses.push(ms);
};
// A fresh documentation-range address per test (RFC 5737), so buckets never carry over.
const someAddress = () => `198.51.100.${Math.floor(Math.random() * 250) + 1}-${randomUUID().slice(0, 6)}`;

async function attempt(email: string, password: string, address: string): Promise<"in" | string> {
  try {
    await signInWithPassword(db, { email, password }, { address, userAgent: "integration test" }, { pause });
    return "in";
  } catch (e) {
    if (e instanceof SignInRefused) return e.message;
    throw e;
  }
}

const signInAudit = (email: string) =>
  db
    .selectFrom("audit_log")
    .select(["outcome", "reason", "actor_id as actorId"])
    .where("action", "=", "sign-in")
    .where(({ ref }) => ref("detail", "->>").key("email" as never), "=", email)
    .orderBy("id")
    .execute();

describe("sign-in waits", () => {
  it("make a guesser at one address wait longer each time, while the owner at another address signs in at once", async () => {
    const fx = await createShopFixture(db);
    const email = fx.users.mechanic.email;
    const attacker = someAddress();
    const answers: string[] = [];
    for (let i = 0; i < 6; i++) answers.push(await attempt(email, `guess-${i}`, attacker));
    // three wrong passwords are checked; the 4th try comes at once after a 2 s wait was asked: refused unchecked
    expect(answers.slice(0, 3)).toEqual([NO_MATCH, NO_MATCH, NO_MATCH]);
    expect(answers.slice(3).every((a) => /^Too many wrong passwords from here\. Wait \d+ seconds?, then try again\.$/.test(a))).toBe(true);
    // even the right password waits at the guesser's address (it is not checked there)…
    expect(await attempt(email, FIXTURE_PASSWORD, attacker)).toMatch(/Wait/);
    // …but the owner, from their own address, is in with it, no wait
    expect(await attempt(email, FIXTURE_PASSWORD, someAddress())).toBe("in");
    // every attempt is in the audit log: 3 wrong passwords, 4 refused for the wait, 1 success
    const audit = await signInAudit(email);
    expect(audit.map((a) => a.outcome)).toEqual([...Array(7).fill("refused"), "accepted"]);
    expect(audit.filter((a) => a.reason === "wrong password")).toHaveLength(3);
    expect(audit.filter((a) => a.reason?.startsWith("waiting "))).toHaveLength(4);
    expect(audit.at(-1)?.actorId).toBe(fx.users.mechanic.id);
    expect(audit.slice(0, -1).every((a) => a.actorId === null)).toBe(true);
  });

  it("hold one address spraying many accounts (or one account under rotated forwarded-for headers) to its own wait", async () => {
    const fx = await createShopFixture(db);
    const spray = someAddress();
    const answers: string[] = [];
    for (let i = 0; i < 40; i++) answers.push(await attempt(`nobody-${i}-${randomUUID().slice(0, 4)}@example.test`, "guess", spray));
    const checked = answers.filter((a) => a === NO_MATCH).length;
    expect(checked).toBe(10); // the address's free failures; the other 30 were refused unchecked
    expect(answers.slice(10).every((a) => a.startsWith("Too many wrong passwords"))).toBe(true);
    // a real user elsewhere is untouched
    expect(await attempt(fx.users.office.email, FIXTURE_PASSWORD, someAddress())).toBe("in");
  });

  it("never lock an account spread over many addresses: the owner's right password still works, after a short pause", async () => {
    const fx = await createShopFixture(db);
    const email = fx.users.supervisor.email;
    for (let i = 0; i < 12; i++) expect(await attempt(email, `guess-${i}`, someAddress())).toBe(NO_MATCH);
    pauses.length = 0;
    expect(await attempt(email, FIXTURE_PASSWORD, someAddress())).toBe("in");
    expect(pauses).toEqual([1500]);
    // a success starts the account's count again: no pause next time
    pauses.length = 0;
    expect(await attempt(email, FIXTURE_PASSWORD, someAddress())).toBe("in");
    expect(pauses).toEqual([]);
  });

  it("count a burst from one address one by one, not all at zero", async () => {
    const fx = await createShopFixture(db);
    const address = someAddress();
    const answers = await Promise.all(Array.from({ length: 12 }, (_, i) => attempt(fx.users.mechanic2.email, `burst-${i}`, address)));
    expect(answers.filter((a) => a === NO_MATCH)).toHaveLength(3);
  });

  it("are listed for the office with the wait each asks, and clearing one lets that address try again", async () => {
    const fx = await createShopFixture(db);
    const email = fx.users.customer.email;
    const address = someAddress();
    for (let i = 0; i < 5; i++) await attempt(email, `guess-${i}`, address);
    const rows = await signInWaitRows(db, fx.shopId);
    const pair = rows.find((r) => r.key === bucketKey("pair", { email, address }));
    expect(pair).toMatchObject({ kind: "pair", email, address, failures: 3 });
    expect(pair!.waitSeconds).toBeGreaterThan(0);
    // another shop sees none of it, and cannot clear it
    const other = await createShopFixture(db);
    expect((await signInWaitRows(db, other.shopId)).some((r) => r.email === email)).toBe(false);
    expect(await clearSignInBucket(db, other.shopId, pair!.key, other.users.office.id)).toBe("not-ours");
    expect(await clearSignInBucket(db, fx.shopId, pair!.key, fx.users.office.id)).toBe("cleared");
    expect(await attempt(email, FIXTURE_PASSWORD, address)).toBe("in");
    const cleared = await db.selectFrom("sign_in_waits_cleared").selectAll().where("key", "=", pair!.key).execute();
    expect(cleared).toHaveLength(1);
  });

  it("one address's wait is not one shop's to clear once it counts wrong passwords against another shop's sign-ins", async () => {
    const fx = await createShopFixture(db);
    const other = await createShopFixture(db);
    const address = someAddress();
    const key = bucketKey("address", { address });
    // one wrong password on this shop's sign-in: the office may clear that address's count
    await attempt(fx.users.customer.email, "guess-0", address);
    expect(await clearSignInBucket(db, fx.shopId, key, fx.users.office.id)).toBe("cleared");
    // then guesses against the other shop's sign-ins, and addresses nobody has, from the same address
    await attempt(fx.users.customer.email, "guess-1", address);
    await attempt(other.users.supervisor.email, "guess-2", address);
    await attempt(`nobody-${randomUUID().slice(0, 6)}@example.test`, "guess-3", address);
    expect(await clearSignInBucket(db, fx.shopId, key, fx.users.office.id)).toBe("others-too");
    const cleared = await db.selectFrom("sign_in_waits_cleared").select("id").where("key", "=", key).execute();
    expect(cleared).toHaveLength(1);
  });

  it("refuse a turned-off account with the same words as a wrong password", async () => {
    const fx = await createShopFixture(db);
    await db.updateTable("users").set({ active: false }).where("id", "=", fx.users.mechanic.id).execute();
    expect(await attempt(fx.users.mechanic.email, FIXTURE_PASSWORD, someAddress())).toBe(NO_MATCH);
    expect((await signInAudit(fx.users.mechanic.email)).at(-1)?.reason).toBe("account turned off");
  });
});
