import { createHash, randomUUID } from "node:crypto";
import bcrypt from "bcryptjs";
import { sql } from "kysely";
import { beforeAll, describe, expect, it, vi } from "vitest";
import { putObject } from "@/app/_server/object-store";
import { GET as customerPhoto } from "@/app/api/my-bikes/photos/[id]/route";
import { GET as customerThread, POST as customerAsks } from "@/app/api/my-bikes/work-orders/[id]/messages/route";
import { GET as unanswered } from "@/app/api/office/messages/unanswered/route";
import { POST as inviteAgain } from "@/app/api/office/users/[id]/invitation/route";
import { POST as makeUser } from "@/app/api/office/users/route";
import { POST as officeReplies } from "@/app/api/office/work-orders/[id]/messages/route";
import { POST as shareProgress } from "@/app/api/office/work-orders/[id]/progress-updates/route";
import { POST as setPassword } from "@/app/api/welcome/route";
import { startSession, userOfSession } from "@/db/auth/sessions";
import { setPasswordFromLink } from "@/db/customer-contact/invitations";
import { mailTo, useFakes } from "./support/fakes";
import { eventually, useQueueWorkers } from "./support/queue";
import { appRequest } from "./support/route-calls";
import { createShopFixture, type ShopFixture } from "./support/shop-fixture";
import { useTestDb } from "./support/test-db";

// The customer's side of a job on real PostgreSQL, the real queue and maildev: invitation links
// (made when the e-mail is sent, kept as a hash, single use, expiring, retired by a newer one, and
// refused for another sign-in), the message thread's access rules and e-mails, and progress
// update photos served only to the customer whose bike they show.

const claim = vi.hoisted(() => ({ current: null as { userId: string; sessionId: string } | null }));
vi.mock("@/app/_server/signed-in", () => ({ signedInClaim: async () => claim.current }));

const db = useTestDb();
useQueueWorkers(db);
let ports: ReturnType<typeof useFakes>;
let fx: ShopFixture;
beforeAll(async () => {
  ports = useFakes();
  fx = await createShopFixture(db);
});

const post = (path: string, body: unknown) =>
  appRequest(path, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(body) });
const get = (path: string) => appRequest(path);
const sha = (t: string) => createHash("sha256").update(t, "utf8").digest();

/** A customer of the fixture shop with a bike, a work order and (when asked) a sign-in. */
async function anotherCustomer(name: string) {
  const tag = randomUUID().slice(0, 8);
  const c = await db
    .insertInto("customers")
    .values({ shop_id: fx.shopId, name: `${name} ${tag}`, email: `${name.toLowerCase()}-${tag}@example.test`, phone: null })
    .returning(["id", "email"])
    .executeTakeFirstOrThrow();
  const bike = await db
    .insertInto("bikes")
    .values({
      shop_id: fx.shopId,
      customer_id: c.id,
      make: "Other",
      model: "Twin",
      year: 2001,
      tag_code: `OT-${tag}`,
      vin: null,
      engine_number: null,
      displacement_cc: 900,
      colour: null,
    })
    .returning("id")
    .executeTakeFirstOrThrow();
  const w = await db
    .insertInto("work_orders")
    .values({
      shop_id: fx.shopId,
      bike_id: bike.id,
      number: 100 + Math.floor(Math.random() * 100000),
      title: "Other job",
      status: "in_build",
      intake_odometer_km: 1,
      assigned_mechanic_id: null,
      closed_at: null,
    })
    .returning("id")
    .executeTakeFirstOrThrow();
  return { customerId: c.id, email: c.email!, workOrderId: w.id };
}

/** Makes a customer's sign-in through the office's route (no password: an invitation is e-mailed) and answers the link's token from maildev. */
async function inviteNewSignIn(name: string) {
  const other = await anotherCustomer(name);
  const email = `login-${randomUUID().slice(0, 8)}@example.test`;
  const r = await makeUser.handle(
    post("/api/office/users", { name, email, role: "customer", customerId: other.customerId, password: "" }),
    {
      userId: fx.users.office.id,
      db,
    },
  );
  expect(r.status).toBe(201);
  const made = (await r.json()) as { id: string; invitation: { invitationId: string; sentTo: string } };
  expect(made.invitation.sentTo).toBe(email);
  return { ...other, userId: made.id, email, token: await tokenFromMail(email, 1) };
}

async function tokenFromMail(address: string, count: number): Promise<string> {
  const mails = await mailTo(ports.mailWeb, address, count, 15_000);
  expect(mails.length).toBe(count);
  const text = mails[count - 1].text ?? "";
  const m = /\/welcome\/([A-Za-z0-9_-]{43})\b/.exec(text);
  expect(m, `a link in: ${text}`).not.toBeNull();
  return m![1];
}

async function passwordHashOf(userId: string) {
  return (await db.selectFrom("users").select("password_hash").where("id", "=", userId).executeTakeFirstOrThrow()).password_hash;
}

describe("invitation links", () => {
  it("e-mails a link whose token the database keeps only as a hash; the link sets the password once", async () => {
    const c = await inviteNewSignIn("Ines");
    // the outbox holds the placeholder, never the link; the link table holds the SHA-256 only
    const outbox = await db.selectFrom("mail_outbox").select("body").where("recipient", "=", c.email).executeTakeFirstOrThrow();
    expect(outbox.body).toContain("[[invitation-link]]");
    expect(outbox.body).not.toContain(c.token);
    const links = await db
      .selectFrom("invitation_links")
      .select(["token_sha256", "made_at", "expires_at"])
      .where("user_id", "=", c.userId)
      .execute();
    expect(links).toHaveLength(1);
    expect(Buffer.compare(links[0].token_sha256, sha(c.token))).toBe(0);
    expect(links[0].expires_at.getTime() - links[0].made_at.getTime()).toBe(72 * 3600_000);
    const hit = await sql<{
      n: number;
    }>`SELECT count(*)::int AS n FROM invitation_links WHERE encode(token_sha256, 'escape') LIKE ${"%" + c.token + "%"}`.execute(db);
    expect(hit.rows[0].n).toBe(0);
    // the random password made with the sign-in is nothing anyone typed
    expect(await bcrypt.compare("", await passwordHashOf(c.userId))).toBe(false);

    const ok = await setPassword.handle(post("/api/welcome", { token: c.token, password: "gannet-street-1", repeat: "gannet-street-1" }), {
      db,
    });
    expect(ok.status).toBe(200);
    expect(await ok.json()).toEqual({ email: c.email });
    const hash = await passwordHashOf(c.userId);
    expect(await bcrypt.compare("gannet-street-1", hash)).toBe(true);

    const again = await setPassword.handle(post("/api/welcome", { token: c.token, password: "another-pass-2", repeat: "another-pass-2" }), {
      db,
    });
    expect(again.status).toBe(409);
    expect((await again.json()).error).toMatch(/already been used to set a password\. Nothing was changed/);
    expect(await passwordHashOf(c.userId)).toBe(hash);
  });

  it("refuses an expired link, a link replaced by a newer one, and a link that is not ours, changing nothing", async () => {
    // a sign-in whose only link was e-mailed 73 hours ago (dated back in the database)
    const c = await anotherCustomer("Egon");
    const u = await db
      .insertInto("users")
      .values({
        shop_id: fx.shopId,
        email: `egon-${randomUUID().slice(0, 8)}@example.test`,
        name: "Egon",
        role: "customer",
        password_hash: "$2b$04$x",
        customer_id: c.customerId,
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    const inv = await db
      .insertInto("customer_invitations")
      .values({ shop_id: fx.shopId, user_id: u.id, invited_by: fx.users.office.id })
      .returning("id")
      .executeTakeFirstOrThrow();
    const expired = "E".repeat(43);
    await sql`INSERT INTO invitation_links (shop_id, invitation_id, user_id, token_sha256, made_at, expires_at)
              VALUES (${fx.shopId}, ${inv.id}, ${u.id}, ${sha(expired)}, now() - interval '73 hours', now() - interval '1 hour')`.execute(
      db,
    );
    const r = await setPassword.handle(post("/api/welcome", { token: expired, password: "late-password-1", repeat: "late-password-1" }), {
      db,
    });
    expect(r.status).toBe(409);
    expect((await r.json()).error).toMatch(/has expired \(links work for 72 hours\)\. Nothing was changed/);
    expect(await passwordHashOf(u.id)).toBe("$2b$04$x");
    expect(
      await db
        .selectFrom("invitation_uses")
        .select("link_id")
        .where("link_id", "in", db.selectFrom("invitation_links").select("id").where("user_id", "=", u.id))
        .execute(),
    ).toEqual([]);

    // the office sends a new invitation: the first link stops working, the newest one works
    const d = await inviteNewSignIn("Dora");
    const again = await inviteAgain.handle(post(`/api/office/users/${d.userId}/invitation`, {}), {
      userId: fx.users.office.id,
      db,
      params: { id: d.userId },
    });
    expect(again.status).toBe(201);
    const newest = await tokenFromMail(d.email, 2);
    expect(newest).not.toBe(d.token);
    const before = await passwordHashOf(d.userId);
    const stale = await setPassword.handle(
      post("/api/welcome", { token: d.token, password: "stale-password-1", repeat: "stale-password-1" }),
      { db },
    );
    expect(stale.status).toBe(409);
    expect((await stale.json()).error).toMatch(/A newer invitation was sent after this one/);
    expect(await passwordHashOf(d.userId)).toBe(before);
    const fresh = await setPassword.handle(
      post("/api/welcome", { token: newest, password: "fresh-password-1", repeat: "fresh-password-1" }),
      { db },
    );
    expect(fresh.status).toBe(200);

    // a well-formed token we never sent
    const unknown = await setPassword.handle(
      post("/api/welcome", { token: "A".repeat(43), password: "some-password-1", repeat: "some-password-1" }),
      { db },
    );
    expect(unknown.status).toBe(404);
    expect((await unknown.json()).error).toMatch(/not one we sent/);
  });

  it("refuses a link for another customer's sign-in while this browser is signed in as someone else", async () => {
    const c = await inviteNewSignIn("Olga");
    const before = await passwordHashOf(c.userId);
    claim.current = { userId: fx.users.customer.id, sessionId: randomUUID() };
    try {
      const r = await setPassword.handle(post("/api/welcome", { token: c.token, password: "not-mine-pass-1", repeat: "not-mine-pass-1" }), {
        db,
      });
      expect(r.status).toBe(403);
      expect((await r.json()).error).toMatch(/for another customer's sign-in.*Nothing was changed/);
    } finally {
      claim.current = null;
    }
    expect(await passwordHashOf(c.userId)).toBe(before);
    // the link still works for its own customer afterwards
    const ok = await setPassword.handle(post("/api/welcome", { token: c.token, password: "mine-at-last-1", repeat: "mine-at-last-1" }), {
      db,
    });
    expect(ok.status).toBe(200);
  });

  it("setting the password ends every session the sign-in had: a cookie held before does not outlive the old password", async () => {
    const c = await inviteNewSignIn("Otto");
    const user = { id: c.userId, shopId: fx.shopId, role: "customer" as const };
    const before = await startSession(db, user, { address: "203.0.113.9", userAgent: "someone else's browser" });
    expect("user" in (await userOfSession(db, before))).toBe(true);
    await setPasswordFromLink(db, { token: c.token, password: "brand-new-pass-1", signedInUserId: null });
    expect(await userOfSession(db, before)).toEqual({ refused: expect.any(String) });
    const row = await db.selectFrom("sessions").select(["ended_reason"]).where("id", "=", before).executeTakeFirstOrThrow();
    expect(row.ended_reason).toBe("password-set");
    // a sign-in with the new password starts a session that stands
    const after = await startSession(db, user, { address: "198.51.100.2", userAgent: "the customer's browser" });
    expect("user" in (await userOfSession(db, after))).toBe(true);
  });

  it("lets exactly one of two uses at the same moment through", async () => {
    const c = await inviteNewSignIn("Rita");
    const tries = await Promise.allSettled(
      ["racing-pass-aa", "racing-pass-bb", "racing-pass-cc"].map((password) =>
        setPasswordFromLink(db, { token: c.token, password, signedInUserId: null }),
      ),
    );
    expect(tries.filter((t) => t.status === "fulfilled")).toHaveLength(1);
    expect(tries.filter((t) => t.status === "rejected").map((t) => (t as PromiseRejectedResult).reason.status)).toEqual([409, 409]);
    const uses = await db
      .selectFrom("invitation_uses")
      .select("link_id")
      .where("link_id", "in", db.selectFrom("invitation_links").select("id").where("user_id", "=", c.userId))
      .execute();
    expect(uses).toHaveLength(1);
  });

  it("says what is wrong with a bad link or password in workshop words", async () => {
    const cases: Array<[unknown, RegExp]> = [
      [
        { token: "abc\u0000", password: "good-password-1", repeat: "good-password-1" },
        /^token: the link is incomplete: open it from the e-mail again$/,
      ],
      [{ token: "A".repeat(5000), password: "good-password-1", repeat: "good-password-1" }, /^token: the link is incomplete/],
      [{ token: "A".repeat(43), password: "short", repeat: "short" }, /^password: at least 10 characters$/],
      [{ token: "A".repeat(43), password: "x".repeat(201), repeat: "x".repeat(201) }, /^password: at most 200 characters$/],
      [{ token: "A".repeat(43), password: "good-password-1", repeat: "good-password-2" }, /^repeat: the two passwords differ$/],
    ];
    for (const [body, message] of cases) {
      const r = await setPassword.handle(post("/api/welcome", body), { db });
      expect(r.status).toBe(400);
      const answer = (await r.json()) as { error: string; issues: Array<{ path: string; message: string }> };
      expect(answer.error).toBe("Check the marked fields.");
      expect(answer.issues.map((i) => `${i.path}: ${i.message}`).join(" | ")).toMatch(message);
    }
  });
});

describe("the message thread of a job", () => {
  it("lets the customer write only on their own jobs; the office sees it unanswered until it replies; e-mails go both ways", async () => {
    const other = await anotherCustomer("Nils");
    const asks = (workOrderId: string, body: unknown, userId = fx.users.customer.id) =>
      customerAsks.handle(post(`/api/my-bikes/work-orders/${workOrderId}/messages`, body), { userId, db, params: { id: workOrderId } });

    // another customer's job: not found, nothing stored, reading refused too
    const foreign = await asks(other.workOrderId, { body: "Is this mine?" });
    expect(foreign.status).toBe(404);
    expect((await foreign.json()).error).toBe("No such job among your bikes.");
    const peek = await customerThread.handle(get(`/api/my-bikes/work-orders/${other.workOrderId}/messages`), {
      userId: fx.users.customer.id,
      db,
      params: { id: other.workOrderId },
    });
    expect(peek.status).toBe(404);
    expect(await db.selectFrom("work_order_messages").select("id").where("work_order_id", "=", other.workOrderId).execute()).toEqual([]);
    // a mechanic is not a customer
    expect((await asks(fx.workOrderId, { body: "Hello" }, fx.users.mechanic.id)).status).toBe(403);

    // hostile text is refused in workshop words
    const nul = await asks(fx.workOrderId, { body: "brake\u0000fluid" });
    expect(nul.status).toBe(400);
    expect(JSON.stringify(await nul.json())).toContain("Message holds a NUL character");
    const long = await asks(fx.workOrderId, { body: "x".repeat(4001) });
    expect(long.status).toBe(400);
    expect(JSON.stringify(await long.json())).toContain("Message: at most 4000 characters.");

    const ok = await asks(fx.workOrderId, { body: "Will the head be back from the machine shop this week?" });
    expect(ok.status).toBe(201);
    const list = async () =>
      (
        (await (await unanswered.handle(get("/api/office/messages/unanswered"), { userId: fx.users.office.id, db })).json()) as {
          threads: Array<{ workOrderId: string; body: string }>;
        }
      ).threads;
    expect((await list()).find((t) => t.workOrderId === fx.workOrderId)?.body).toBe(
      "Will the head be back from the machine shop this week?",
    );
    const [toOffice] = await mailTo(ports.mailWeb, fx.users.office.email, 1, 15_000);
    expect(toOffice.text).toContain("Will the head be back from the machine shop this week?");

    const reply = await officeReplies.handle(post(`/api/office/work-orders/${fx.workOrderId}/messages`, { body: "Yes, on Thursday." }), {
      userId: fx.users.office.id,
      db,
      params: { id: fx.workOrderId },
    });
    expect(reply.status).toBe(201);
    expect(await reply.json()).toMatchObject({ mailed: true });
    expect((await list()).some((t) => t.workOrderId === fx.workOrderId)).toBe(false);
    const { email } = await db.selectFrom("customers").select("email").where("id", "=", fx.customerId).executeTakeFirstOrThrow();
    const toCustomer = (await mailTo(ports.mailWeb, email!, 1, 15_000)).find((m) => m.text?.includes("Yes, on Thursday."));
    expect(toCustomer?.subject).toMatch(/^Reply about your Fixture Test 1000/);

    // the thread as the customer reads it, oldest first, and kept for good
    const thread = (await (
      await customerThread.handle(get(`/api/my-bikes/work-orders/${fx.workOrderId}/messages`), {
        userId: fx.users.customer.id,
        db,
        params: { id: fx.workOrderId },
      })
    ).json()) as {
      messages: Array<{ body: string; fromCustomer: boolean }>;
    };
    expect(thread.messages.map((m) => [m.fromCustomer, m.body])).toEqual([
      [true, "Will the head be back from the machine shop this week?"],
      [false, "Yes, on Thursday."],
    ]);
    await expect(
      sql`UPDATE work_order_messages SET body = 'changed' WHERE work_order_id = ${fx.workOrderId}`.execute(db),
    ).rejects.toThrow();
  });
});

describe("progress updates and their photos", () => {
  it("shares chosen photos of the job; only the customer whose bike it is gets them", async () => {
    const other = await anotherCustomer("Pia");
    const otherUser = await db
      .insertInto("users")
      .values({
        shop_id: fx.shopId,
        email: `pia-${randomUUID().slice(0, 8)}@example.test`,
        name: "Pia",
        role: "customer",
        password_hash: "$2b$04$x",
        customer_id: other.customerId,
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    const photo = async (workOrderId: string, caption: string) => {
      const key = `test/progress/${randomUUID()}.png`;
      const bytes = Buffer.from(`png-bytes-${caption}`);
      await putObject(key, bytes, "image/png");
      const a = await db
        .insertInto("attachments")
        .values({
          shop_id: fx.shopId,
          work_order_id: workOrderId,
          bike_id: null,
          step_id: null,
          purpose: "teardown",
          object_key: key,
          content_type: "image/png",
          byte_size: bytes.length,
          caption,
          uploaded_by: fx.users.office.id,
        })
        .returning("id")
        .executeTakeFirstOrThrow();
      return { id: a.id, bytes };
    };
    const shared = await photo(fx.workOrderId, "bores honed");
    const kept = await photo(fx.workOrderId, "not for the customer");
    const othersPhoto = await photo(other.workOrderId, "another bike");
    const share = (body: unknown) =>
      shareProgress.handle(post(`/api/office/work-orders/${fx.workOrderId}/progress-updates`, body), {
        userId: fx.users.office.id,
        db,
        params: { id: fx.workOrderId },
      });

    // a photo of another job cannot be shared on this one
    const wrong = await share({ note: "Look", photoIds: [othersPhoto.id] });
    expect(wrong.status).toBe(400);
    expect((await wrong.json()).error).toMatch(/not one of this job's stored photos; nothing was shared/);
    const tooLong = await share({ note: "n".repeat(2001), photoIds: [] });
    expect(JSON.stringify(await tooLong.json())).toContain("Note to the customer: at most 2000 characters.");

    const r = await share({ note: "Bores honed and measured; pistons next.", photoIds: [shared.id] });
    expect(r.status).toBe(201);
    const see = (id: string, userId: string) => customerPhoto.handle(get(`/api/my-bikes/photos/${id}`), { userId, db, params: { id } });
    const mine = await see(shared.id, fx.users.customer.id);
    expect(mine.status).toBe(200);
    expect(Buffer.from(await mine.arrayBuffer())).toEqual(shared.bytes);
    expect((await see(shared.id, otherUser.id)).status).toBe(404); // another customer's bike
    expect((await see(kept.id, fx.users.customer.id)).status).toBe(404); // on the job but never shared
    expect((await see(shared.id, fx.users.mechanic.id)).status).toBe(403); // not a customer at all

    const { email } = await db.selectFrom("customers").select("email").where("id", "=", fx.customerId).executeTakeFirstOrThrow();
    await eventually(async () =>
      (await mailTo(ports.mailWeb, email!, 1, 100)).some((m) => m.text?.includes("Bores honed and measured; pistons next.")),
    );
    const mail = (await mailTo(ports.mailWeb, email!, 1)).find((m) => m.text?.includes("Bores honed and measured"))!;
    expect(mail.subject).toMatch(/^News on your Fixture Test 1000/);
    expect(mail.text).toContain("A photo is on your bike's page");
  });
});
