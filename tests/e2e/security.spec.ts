import http from "node:http";
import type { AddressInfo } from "node:net";
import { readdirSync, statSync } from "node:fs";
import path from "node:path";
import Stripe from "stripe";
import { expect, request, test, type APIResponse } from "@playwright/test";
import { DEMO_PASSWORD } from "@/db/seed/demo-people";
import { demoUser, signIn } from "./support/demo-users";
import { query } from "./support/e2e-db";
import { fromOurPage } from "./support/same-origin";
import { cookieHeader, declaredOnly, E2E_PORT, rssMiB, serverPid, signInFrom, streamAt } from "./support/security";

// The attacks of a security review, tried against the running app and kept failing:
// forged posts from another origin, text/plain bodies, a rotated X-Forwarded-For spray, a lock-out
// attempt, sessions after sign-out and after the office ends them, oversized bodies against the
// server's memory, headers on every answer, and the payment webhook's time window.

const APP = `http://localhost:${E2E_PORT}`;
const root = path.resolve(import.meta.dirname, "../..");

/** A small hostile site on another port: its page posts a form and fetches at the app. */
async function hostileSite(html: (app: string) => string): Promise<{ port: number; close: () => Promise<void> }> {
  const server = http.createServer((req, res) => {
    res.writeHead(200, { "content-type": "text/html; charset=utf-8" }).end(html(APP));
  });
  await new Promise<void>((r) => server.listen(0, r));
  return { port: (server.address() as AddressInfo).port, close: () => new Promise((r) => server.close(() => r())) };
}

const forgedOfficePage = (tag: string) => (app: string) => `<!doctype html><html><body>
<form id="f" method="POST" action="${app}/api/office/customers" enctype="text/plain">
  <input name='{"name":"Forged form ${tag}","x":"' value='"}'>
</form>
<script>
  const post = (url, body) => fetch(url, { method: "POST", mode: "no-cors", credentials: "include", headers: { "content-type": "text/plain" }, body: JSON.stringify(body) });
  Promise.allSettled([
    post("${app}/api/office/customers", { name: "Forged fetch ${tag}" }),
    post("${app}/api/office/users", { name: "Forged office ${tag}", email: "forged-${tag}@example.test", role: "office", password: "forged-password-1", customerId: null }),
  ]).then(() => { document.title = "sent"; document.getElementById("f").submit(); });
</script></body></html>`;

for (const site of [
  { name: "same-site (another port of localhost)", host: "localhost" },
  { name: "cross-site (127.0.0.1)", host: "127.0.0.1" },
]) {
  test(`a ${site.name} page cannot make the signed-in office create customers or accounts`, async ({ page }) => {
    const tag = `${site.host.replace(/\W/g, "")}-${Date.now()}`;
    await signIn(page, "office");
    const hostile = await hostileSite(forgedOfficePage(tag));
    try {
      const refused: number[] = [];
      page.on("response", (r) => {
        if (r.url().startsWith(`${APP}/api/office/`) && r.request().method() === "POST") refused.push(r.status());
      });
      await page.goto(`http://${site.host}:${hostile.port}/`);
      await page.waitForURL(`${APP}/api/office/customers`);
      // the form's navigation shows our refusal; the fetches were refused too
      await expect(page.locator("body")).toContainText("did not come from a Benchtag page");
      expect(refused.length).toBeGreaterThanOrEqual(1);
      expect(refused.every((s) => s === 403)).toBe(true);
    } finally {
      await hostile.close();
    }
    const customers = await query("SELECT id FROM customers WHERE name LIKE $1", [`Forged % ${tag}`]);
    const users = await query("SELECT id FROM users WHERE email = $1", [`forged-${tag}@example.test`]);
    expect([customers.length, users.length]).toEqual([0, 0]);
  });
}

test("a same-site page cannot make a signed-in customer approve their quote", async ({ page }) => {
  const felix = demoUser("customer");
  const [quote] = await query<{ id: string }>(
    `SELECT q.id FROM quotes q JOIN work_orders w ON w.id = q.work_order_id JOIN bikes b ON b.id = w.bike_id
     JOIN customers c ON c.id = b.customer_id WHERE c.email = $1 AND q.status = 'sent' LIMIT 1`,
    [felix.email],
  );
  expect(quote, "the demo data has a quote waiting for Felix's approval (work order 1003)").toBeDefined();
  await signIn(page, "customer");
  const hostile = await hostileSite(
    (app) => `<!doctype html><form id="f" method="POST" action="${app}/api/my-bikes/quotes/${quote.id}/approve"></form>
<script>fetch("${app}/api/my-bikes/quotes/${quote.id}/approve", { method: "POST", mode: "no-cors", credentials: "include" })
  .finally(() => document.getElementById("f").submit());</script>`,
  );
  try {
    await page.goto(`http://localhost:${hostile.port}/`);
    await page.waitForURL(/\/approve$/);
    await expect(page.locator("body")).toContainText("did not come from a Benchtag page");
  } finally {
    await hostile.close();
  }
  const [after] = await query<{ status: string }>("SELECT status FROM quotes WHERE id = $1", [quote.id]);
  expect(after.status).toBe("sent");
});

test("a text/plain body is refused even from our own page, and nothing is written", async ({ page }) => {
  await signIn(page, "office");
  const name = `Plain text ${Date.now()}`;
  const res = await page.request.post("/api/office/customers", {
    headers: { ...fromOurPage, "content-type": "text/plain" },
    data: JSON.stringify({ name }),
  });
  expect(res.status()).toBe(415);
  expect(await query("SELECT id FROM customers WHERE name = $1", [name])).toEqual([]);
});

test("a sign-in spray with rotated X-Forwarded-For is held at its real address, and the owner still signs in", async ({ page }) => {
  // The guesser comes from 127.0.0.2 and rotates the header on every try; no proxy is trusted.
  const mechanic = demoUser("mechanic");
  const answers: Array<string | null> = [];
  for (let i = 0; i < 40; i++) {
    const forged = `203.0.113.${i + 1}`;
    answers.push((await signInFrom("127.0.0.2", mechanic.email, `guess-${i}`, { "x-forwarded-for": forged })).error);
  }
  const checked = answers.filter((a) => a?.includes("do not match")).length;
  const held = answers.filter((a) => a?.startsWith("Too many wrong passwords from here")).length;
  expect(checked).toBeLessThanOrEqual(4); // 3 free, maybe one more after a wait ran out
  expect(checked + held).toBe(40);
  // the attempts are on record with the real address, none with a forged one
  const audit = await query<{ address: string }>(
    `SELECT detail->>'clientAddress' AS address FROM audit_log WHERE action = 'sign-in' AND detail->>'email' = $1 ORDER BY id DESC LIMIT 40`,
    [mechanic.email],
  );
  expect(new Set(audit.map((a) => a.address))).toEqual(new Set(["127.0.0.2"]));
  // the owner, at the workshop's own address, signs in with the right password at once
  await signIn(page, "mechanic");
  await expect(page).toHaveURL(/\/bench$/);
});

test("after sign-out the old cookie is refused on /api/me and /api/sync", async ({ page, context }) => {
  await signIn(page, "mechanic2");
  const old = await cookieHeader(context);
  const replay = await request.newContext({ baseURL: APP, extraHTTPHeaders: { cookie: old, ...fromOurPage } });
  const syncBody = { deviceId: "tab-replay-test", cursor: null, operations: [] };
  expect((await replay.get("/api/me")).status()).toBe(200);
  expect((await replay.post("/api/sync", { data: syncBody })).status()).toBe(200);
  await page.getByRole("button", { name: "Sign out" }).click();
  await expect(page).toHaveURL(/\/signin/);
  expect((await replay.get("/api/me")).status()).toBe(401);
  expect((await replay.post("/api/sync", { data: syncBody })).status()).toBe(401);
  await replay.dispose();
});

test("the office ends a tablet's sessions: the tablet hands its unsent work over, clears its store and is refused", async ({ browser }) => {
  const tablet = await browser.newContext();
  const page = await tablet.newPage();
  const priya = await signIn(page, "mechanic2");
  await page.goto("/bench");
  await expect(page.getByTestId("bench-root")).toBeVisible();
  const deviceId = await page.evaluate(() => localStorage.getItem("benchtag-device-id"));
  expect(deviceId).toBeTruthy();
  const [{ id: userId }] = await query<{ id: string }>("SELECT id FROM users WHERE email = $1", [priya.email]);
  // the tablet has named itself to its session
  await expect
    .poll(async () => (await query("SELECT id FROM sessions WHERE device_id = $1 AND ended_at IS NULL", [deviceId])).length)
    .toBe(1);
  // one entry of work not sent yet (the network was down), written as the bench writes it, on demo job #1071
  const entryId = crypto.randomUUID();
  const [{ id: jobId }] = await query<{ id: string }>("SELECT id FROM work_orders WHERE number = 1071");
  await page.evaluate(
    ({ name, entryId, jobId }) =>
      new Promise<void>((resolve, reject) => {
        const open = indexedDB.open(name);
        open.onsuccess = () => {
          const tx = open.result.transaction("outbox", "readwrite");
          tx.objectStore("outbox").put({
            id: entryId,
            workOrderId: jobId,
            stamp: "000000000000001-000000-tab-x",
            op: { kind: "step.completed", id: entryId },
            state: "waiting",
            createdAt: Date.now(),
          });
          tx.oncomplete = () => {
            open.result.close();
            resolve();
          };
          tx.onerror = () => reject(tx.error);
        };
        open.onerror = () => reject(open.error);
      }),
    { name: `benchtag-bench-${userId}`, entryId, jobId },
  );
  const old = await cookieHeader(tablet);

  const office = await (await browser.newContext()).newPage();
  await signIn(office, "office");
  const ended = await office.request.post("/api/office/sessions", { headers: fromOurPage, data: { deviceId } });
  expect(await ended.json()).toEqual({ ended: 1 });

  // the bench notices (at its next check; focus makes it check now), hands over and clears
  await page.evaluate(() => window.dispatchEvent(new Event("focus")));
  await page.waitForURL(/\/signin\?ended=1/, { timeout: 45_000 });
  await expect(page.getByTestId("ended-notice")).toBeVisible();
  // the entry is handed over whether the bench's own sync had it refused first (no such job) or not
  await expect
    .poll(async () => {
      const handed = await query<{ entry_count: number; entries: Array<{ id: string }> }>(
        "SELECT entry_count, entries FROM outbox_handovers WHERE device_id = $1",
        [deviceId],
      );
      return handed.map((h) => [h.entry_count, h.entries[0].id]);
    })
    .toEqual([[1, entryId]]);
  const stores = await page.evaluate(() => indexedDB.databases().then((dbs) => dbs.map((d) => d.name)));
  expect(stores).not.toContain(`benchtag-bench-${userId}`);
  const kept = await page.evaluate(() => caches.keys());
  expect(kept).not.toContain("bench-pages");
  // the tablet's old cookie is refused everywhere, and says the session was ended
  const replay = await request.newContext({ baseURL: APP, extraHTTPHeaders: { cookie: old, ...fromOurPage } });
  const me = await replay.get("/api/me");
  expect([me.status(), me.headers()["benchtag-session"]]).toEqual([401, "ended"]);
  expect((await replay.post("/api/sync", { data: { deviceId, cursor: null, operations: [] } })).status()).toBe(401);
  // it may hand over only once it is ended, and only with its own cookie
  expect((await replay.post("/api/bench/outbox-handover", { data: { deviceId, entries: [], photosLeft: [] } })).status()).toBe(201);
  const stranger = await request.newContext({ baseURL: APP, extraHTTPHeaders: fromOurPage });
  expect((await stranger.post("/api/bench/outbox-handover", { data: { deviceId, entries: [], photosLeft: [] } })).status()).toBe(401);
  await Promise.all([replay.dispose(), stranger.dispose(), tablet.close()]);

  // The job it names keeps an open item until the office settles the hand-over with a note.
  const openItems = async () =>
    ((await (await office.request.get(`/api/office/work-orders/${jobId}`)).json()) as { openItems: Array<{ kind: string }> }).openItems;
  expect((await openItems()).filter((i) => i.kind === "handover_not_settled")).toHaveLength(1);
  await office.goto("/office/users");
  const handover = office.getByTestId("handover").filter({ hasText: deviceId! });
  const line = handover.getByTestId("handover-job").filter({ hasText: "Job #1071" });
  await expect(line).toContainText("1 entry — ◷ not settled");
  await line.getByRole("button", { name: "Settle the hand-over on job #1071" }).click();
  const note = line.getByLabel("What was done with this work on job #1071?");
  await note.fill("ok");
  await line.getByRole("button", { name: "Settle it" }).click();
  await expect(line.getByTestId(/^error-settle-/)).toHaveText(
    "✖ Write at least 10 characters: what was re-entered on the record, or why nothing needs to be.",
  );
  await note.fill("Priya re-entered the step at the bench after signing in again.");
  await line.getByRole("button", { name: "Settle it" }).click();
  await expect(line).toContainText("✔ settled by Maren");
  await expect(line).toContainText("“Priya re-entered the step at the bench after signing in again.”");
  expect((await openItems()).filter((i) => i.kind === "handover_not_settled")).toEqual([]);
});

const BOUNDARY = "----benchtag-e2e";
// a form part holding a PNG (by its signature); the 200 MiB that follow are the rest of the "photo"
const PHOTO_PART_HEAD = Buffer.concat([
  Buffer.from(`--${BOUNDARY}\r\nContent-Disposition: form-data; name="photos"; filename="huge.png"\r\nContent-Type: image/png\r\n\r\n`),
  Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
]);

test("oversized bodies are refused while they stream: 200 MiB leaves the server's memory within 50 MiB", async ({ browser }) => {
  const pid = serverPid();
  const mech = await browser.newContext();
  await signIn(await mech.newPage(), "mechanic");
  const office = await browser.newContext();
  await signIn(await office.newPage(), "office");
  const targets = [
    {
      what: "payment webhook (no session)",
      url: `${APP}/api/payments/webhook`,
      headers: { "content-type": "application/json" },
      want: 413,
      framing: {},
    },
    {
      what: "step photo bytes",
      url: `${APP}/api/bench/photos/${crypto.randomUUID()}`,
      headers: { "content-type": "image/jpeg", cookie: await cookieHeader(mech), ...fromOurPage },
      want: 404,
      framing: {},
    },
    {
      what: "office intake form with a 200 MiB photo",
      url: `${APP}/api/office/work-orders`,
      headers: { "content-type": `multipart/form-data; boundary=${BOUNDARY}`, cookie: await cookieHeader(office), ...fromOurPage },
      framing: { head: PHOTO_PART_HEAD, tail: Buffer.from(`\r\n--${BOUNDARY}--\r\n`) },
      want: 413,
    },
    {
      what: "sync batch",
      url: `${APP}/api/sync`,
      headers: { "content-type": "application/json", cookie: await cookieHeader(mech), ...fromOurPage },
      want: 413,
      framing: {},
    },
  ];
  for (const t of targets) {
    // declared as 200 MiB: refused from the header alone
    expect([t.what, await declaredOnly(t.url, t.headers, 200 * 1024 * 1024)]).toEqual([t.what, 413]);
    await streamAt(t.url, t.headers, 2, pid, t.framing); // the route's code loaded before measuring
    const before = rssMiB(pid);
    // 200 MiB without a length: counted as it streams. The server answers, then may cut the
    // connection while the client is still writing (-1: the answer was not read in time).
    const r = await streamAt(t.url, t.headers, 200, pid, t.framing);
    const growth = r.peakMiB - before;
    console.log(`${t.what}: answered ${r.status}; server memory ${before.toFixed(0)} → peak ${r.peakMiB.toFixed(0)} MiB`);
    expect([t.what, [t.want, -1].includes(r.status)]).toEqual([t.what, true]);
    expect(growth, `${t.what}: memory growth in MiB`).toBeLessThan(50);
  }
  await Promise.all([mech.close(), office.close()]);
});

// ——— headers on every answer ———

function filesNamed(dir: string, name: string): string[] {
  return readdirSync(dir).flatMap((n) => {
    const full = path.join(dir, n);
    return statSync(full).isDirectory() ? filesNamed(full, name) : n === name ? [full] : [];
  });
}
/** Every page and API route of the app, with a made-up id for its [segments]. */
function appPaths(file: string): string {
  const rel = path.relative(path.join(root, "app"), path.dirname(file)).split(path.sep);
  return (
    "/" +
    rel
      .filter((s) => s && !s.startsWith("(") && !s.startsWith("_"))
      .map((s) => (s.startsWith("[...") ? "x/y" : s.startsWith("[") ? "00000000-0000-4000-8000-000000000000" : s))
      .join("/")
  );
}

function expectSecurityHeaders(what: string, res: APIResponse) {
  const h = res.headers();
  expect([what, h["x-frame-options"]]).toEqual([what, "DENY"]);
  expect([what, h["x-content-type-options"]]).toEqual([what, "nosniff"]);
  expect([what, h["referrer-policy"]]).toEqual([what, "same-origin"]);
  expect([what, h["permissions-policy"]?.includes("camera=(self)")]).toEqual([what, true]);
  expect([what, h["strict-transport-security"]]).toEqual([what, "max-age=31536000; includeSubDomains"]);
  expect([what, h["content-security-policy"]?.includes("frame-ancestors 'none'")]).toEqual([what, true]);
}

test("every page, API route, static file and error carries the security headers", async ({ page }) => {
  await signIn(page, "office");
  const pages = filesNamed(path.join(root, "app"), "page.tsx").map(appPaths);
  const apis = filesNamed(path.join(root, "app/api"), "route.ts").map(appPaths);
  expect(pages.length).toBeGreaterThan(15);
  expect(apis.length).toBeGreaterThan(35);
  const html = await (await page.request.get("/office")).text();
  const script = /src="(\/_next\/static\/[^"]+\.js)"/.exec(html)?.[1];
  expect(script).toBeTruthy();
  const others = ["/sw.js", script!, "/icons/icon-192.png", "/manifest.webmanifest", "/no-such-page", "/api/no-such-route"];
  const anonymous = await request.newContext({ baseURL: APP });
  for (const p of [...pages, ...apis, ...others]) {
    for (const ctx of [page.request, anonymous]) {
      const res = await ctx.get(p, { maxRedirects: 0 });
      expectSecurityHeaders(`GET ${p} → ${res.status()}`, res);
    }
  }
  // a refused post and a server error carry them too
  expectSecurityHeaders("refused POST", await anonymous.post("/api/office/customers", { data: {} }));
  await anonymous.dispose();
});

test("pages carry a nonce policy, their scripts the nonce, and no page breaks it", async ({ page }) => {
  const violations: string[] = [];
  page.on("console", (m) => {
    if (/Content.Security.Policy|Refused to/i.test(m.text())) violations.push(`${page.url()}: ${m.text()}`);
  });
  const res = await page.goto("/signin");
  const policy = res!.headers()["content-security-policy"];
  const nonce = /'nonce-([^']+)'/.exec(policy)?.[1];
  expect(nonce).toBeTruthy();
  expect(policy).toContain("'strict-dynamic'");
  const tags = (await res!.text()).match(/<script\b[^>]*>/g) ?? [];
  expect(tags.length).toBeGreaterThan(0);
  expect(tags.filter((t) => !t.includes(`nonce="${nonce}"`))).toEqual([]);
  // a second answer has another nonce
  const again = (await page.request.get("/signin")).headers()["content-security-policy"];
  expect(/'nonce-([^']+)'/.exec(again)?.[1]).not.toBe(nonce);
  // the office's pages, the dyno charts and the bench run without a policy violation
  await signIn(page, "office");
  for (const p of ["/office", "/office/customers", "/office/users", "/dyno", "/audit", "/calculators"]) {
    await page.goto(p);
    await expect(page.locator("main, [data-testid=bench-root]").first()).toBeVisible();
  }
  const [run] = await query<{ work_order_id: string }>("SELECT work_order_id FROM dyno_runs WHERE withdrawn_at IS NULL LIMIT 1");
  await page.goto(`/jobs/${run.work_order_id}/dyno`);
  await expect(page.getByTestId("curve-chart").locator("path.recharts-line-curve").first()).toBeVisible();
  await page.getByRole("button", { name: "Sign out" }).click();
  await expect(page).toHaveURL(/\/signin/);
  await signIn(page, "mechanic");
  await page.goto("/bench");
  await expect(page.getByTestId("bench-root")).toBeVisible();
  expect(await page.evaluate(() => navigator.serviceWorker.ready.then((r) => !!r.active))).toBe(true);
  expect(violations).toEqual([]);
});

test("the app cannot be framed by another site", async ({ page }) => {
  const hostile = await hostileSite((app) => `<!doctype html><iframe id="f" src="${app}/signin" width="600" height="400"></iframe>`);
  try {
    await page.goto(`http://127.0.0.1:${hostile.port}/`);
    // the browser refuses to show our page in the frame and puts its own error page there
    await expect
      .poll(
        () =>
          page
            .frames()
            .find((f) => f !== page.mainFrame())
            ?.url() ?? "",
      )
      .toMatch(/^chrome-error:/);
  } finally {
    await hostile.close();
  }
});

test("the payment webhook refuses a signature dated in the future", async () => {
  const ctx = await request.newContext({ baseURL: APP });
  const payload = JSON.stringify({
    id: `evt_future_${Date.now()}`,
    object: "event",
    type: "payment_intent.succeeded",
    data: { object: {} },
  });
  const secret = process.env.STRIPE_WEBHOOK_SECRET ?? "whsec_benchtag_local";
  for (const [ahead, want] of [
    [24 * 3600, 400],
    [10 * 60, 400],
  ] as const) {
    const signature = Stripe.webhooks.generateTestHeaderString({ payload, secret, timestamp: Math.floor(Date.now() / 1000) + ahead });
    const res = await ctx.post("/api/payments/webhook", {
      headers: { "content-type": "application/json", "stripe-signature": signature },
      data: payload,
    });
    expect([ahead, res.status(), (await res.json()).error]).toEqual([ahead, want, expect.stringMatching(/in the future/)]);
  }
  await ctx.dispose();
});

test("signing in with the right password works from a fresh address even while the account is being guessed from many", async () => {
  // one account, guessed from ten addresses in turn (each its own bucket): its owner is only slowed
  const mechanic = demoUser("mechanic");
  for (let i = 10; i < 20; i++) expect((await signInFrom(`127.0.0.${i}`, mechanic.email, "wrong")).error).toContain("do not match");
  const started = Date.now();
  const owner = await signInFrom("127.0.0.30", mechanic.email, DEMO_PASSWORD);
  expect([owner.ok, owner.error]).toEqual([true, null]);
  expect(Date.now() - started).toBeGreaterThanOrEqual(1400); // the account's pause, never a lock
  // the cookie it got works
  const me = await request.newContext({ baseURL: APP, extraHTTPHeaders: { cookie: owner.cookie } });
  expect((await (await me.get("/api/me")).json()).name).toBe(mechanic.name);
  await me.dispose();
});

test("a production start refuses missing or default secrets and plain http, and starts with real ones", async () => {
  const { spawn } = await import("node:child_process");
  const start = (env: Record<string, string | undefined>) =>
    new Promise<{ code: number | null; out: string }>((resolve) => {
      const child = spawn(process.execPath, ["server.mjs"], {
        cwd: root,
        env: {
          PATH: process.env.PATH,
          HOME: process.env.HOME,
          NEXT_TELEMETRY_DISABLED: "1",
          NODE_ENV: "production",
          PORT: String(E2E_PORT + 6),
          ...env,
        },
      });
      let out = "";
      const done = (code: number | null) => resolve({ code, out });
      child.stdout.on("data", (d) => {
        out += d;
        if (out.includes("[benchtag] serving on")) {
          child.kill("SIGTERM");
          done(0);
        }
      });
      child.stderr.on("data", (d) => (out += d));
      child.on("exit", (code) => done(code));
      setTimeout(() => child.kill("SIGKILL"), 60_000);
    });
  const refused = await start({ NEXTAUTH_SECRET: "e2e-only-secret-not-for-production", STRIPE_WEBHOOK_SECRET: "whsec_benchtag_local" });
  expect(refused.code).toBe(1);
  expect(refused.out).toContain("Benchtag refuses to start in production with these settings:");
  expect(refused.out).toContain("NEXTAUTH_SECRET is the local demo's value");
  expect(refused.out).toContain("STRIPE_WEBHOOK_SECRET is the local demo's value");
  const started = await start({
    NEXTAUTH_SECRET: "a-real-secret-of-at-least-32-characters-1234",
    NEXTAUTH_URL: "https://bench.example.test",
    STRIPE_WEBHOOK_SECRET: "whsec_production_example",
    STRIPE_SECRET_KEY: "sk_live_production_example",
    S3_SECRET_ACCESS_KEY: "production-example",
  });
  expect([started.code, started.out]).toEqual([0, expect.stringContaining("[benchtag] serving on")]);
});

test("on Sign-ins the office sees who is signed in on which tablet, ends a tablet's sessions and clears a sign-in wait", async ({
  browser,
}) => {
  // a guesser leaves a wait on Dana's account at 127.0.0.3
  const dana = demoUser("supervisor");
  for (let i = 0; i < 4; i++) await signInFrom("127.0.0.3", dana.email, `guess-${i}`);
  const tablet = await (await browser.newContext()).newPage();
  await signIn(tablet, "mechanic");
  await tablet.goto("/bench");
  await expect(tablet.getByTestId("bench-root")).toBeVisible();
  const deviceId = (await tablet.evaluate(() => localStorage.getItem("benchtag-device-id")))!;
  await expect
    .poll(async () => (await query("SELECT id FROM sessions WHERE device_id = $1 AND ended_at IS NULL", [deviceId])).length)
    .toBe(1);

  const office = await (await browser.newContext()).newPage();
  await signIn(office, "office");
  await office.goto("/office/users");
  const row = office.getByTestId("session-row").filter({ hasText: deviceId });
  await expect(row).toContainText("Tomas Reyes");
  const wait = office.getByTestId("wait-row").filter({ hasText: dana.email }).filter({ hasText: "127.0.0.3" });
  await expect(wait).toContainText("One account from one address");
  await office.screenshot({ path: "test-results/office-sign-ins.png", fullPage: true });
  await row.getByRole("button", { name: `End every session on tablet ${deviceId}` }).click();
  await expect(office.getByTestId("session-row").filter({ hasText: deviceId })).toHaveCount(0);
  expect((await tablet.request.get("/api/me")).status()).toBe(401);
  const clearedCount = async () =>
    Number(
      (
        await query<{ n: string }>("SELECT count(*) AS n FROM audit_log WHERE action = 'sign-in.wait-cleared' AND entity_id = $1", [
          `pair:${dana.email}|127.0.0.3`,
        ])
      )[0].n,
    );
  const clearedBefore = await clearedCount();
  await wait.getByRole("button", { name: /Clear the sign-in wait/ }).click();
  await expect(office.getByTestId("wait-row").filter({ hasText: dana.email }).filter({ hasText: "127.0.0.3" })).toHaveCount(0);
  expect(await clearedCount()).toBe(clearedBefore + 1);
});
