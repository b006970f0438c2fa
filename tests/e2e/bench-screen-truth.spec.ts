import { randomUUID } from "node:crypto";
import { expect, test, type Page } from "@playwright/test";
import { formatStamp } from "@/lib/sync/hlc";
import { query } from "./support/e2e-db";
import { outboxStates as outboxStatesOf, typeTag, waitForServiceWorker, waitForSynced } from "./support/bench-pad";
import { demoUser, signIn } from "./support/demo-users";
import { openStep } from "./support/review-bench";
import { fromOurPage } from "./support/same-origin";

// The tablet's screen tells the truth and a tap records what it showed. Demo job #1006 (tag
// GSW-0006, assigned to Tomas Reyes); step 12 torques the ten head bolts (spiral from the centre,
// three passes, with a torque-to-yield caution). No other test records on that step; each test
// here reads where the sequence stands and works from there.

const HEAD_BOLTS_STEP = 12;

async function openHeadBolts(page: Page) {
  await typeTag(page, "GSW-0006");
  await page.getByRole("button", { name: "Open this bike's job" }).click();
  await expect(page.getByRole("heading", { name: "Vireo Nine Fifty" })).toBeVisible();
  await openStep(page, HEAD_BOLTS_STEP);
  await expect(page.getByTestId("step-title")).toHaveText("Torque head bolts");
}

const headBoltRecords = async () =>
  query<{ pass_index: number; bolt: number; n: number }>(
    `SELECT t.pass_index, t.bolt, count(*)::int AS n FROM torque_records t JOIN template_steps s ON s.id = t.step_id
     JOIN work_orders w ON w.id = t.work_order_id WHERE w.number = 1006 AND s.key = 'head-bolts' GROUP BY 1, 2 ORDER BY 1, 2`,
  );

for (const viewport of [
  { width: 1024, height: 768 },
  { width: 768, height: 1024 },
]) {
  test(`the torque confirm names bolt, pass and target and sits on screen at ${viewport.width}×${viewport.height}, cautions included`, async ({
    browser,
  }) => {
    const context = await browser.newContext({ viewport });
    const page = await context.newPage();
    await signIn(page, "mechanic");
    await waitForSynced(page);
    await openHeadBolts(page);
    const cautions = page.getByRole("region", { name: "Cautions" });
    await expect(cautions).toContainText("Stretch bolts (torque-to-yield)");
    await expect(page.getByRole("button", { name: "I have read these cautions" })).toBeVisible();

    const confirm = page.getByTestId("torque-confirm");
    const [, pass, passes, bolt] = (await page.getByTestId("torque-next").textContent())!.match(/Pass (\d) of (\d): bolt (\d+)/)!;
    await expect(confirm).toHaveAccessibleName(new RegExp(`^Bolt ${bolt} of 10 — pass ${pass} of ${passes} — `));
    const inView = async (label: string) => {
      const box = (await confirm.boundingBox())!;
      expect(box.y, `${label}: top of the confirm`).toBeGreaterThanOrEqual(0);
      expect(box.y + box.height, `${label}: bottom of the confirm`).toBeLessThanOrEqual(viewport.height);
      expect(box.height, `${label}: confirm height`).toBeGreaterThanOrEqual(64);
      expect(box.width, `${label}: confirm width`).toBeGreaterThanOrEqual(viewport.width / 2);
    };
    expect(await page.evaluate(() => window.scrollY)).toBe(0);
    await inView("cautions open");
    await page.screenshot({ path: test.info().outputPath(`torque-${viewport.width}x${viewport.height}-cautions.png`) });

    // Read: the block folds to one line; the confirm stays in the same place.
    await page.getByRole("button", { name: "I have read these cautions" }).click();
    await expect(cautions).toContainText("Cautions read");
    await inView("cautions read");
    await page.screenshot({ path: test.info().outputPath(`torque-${viewport.width}x${viewport.height}-read.png`) });
    await context.close();
  });
}

/** What the tablet's outbox holds, by state (read straight from IndexedDB). */
async function outboxStates(page: Page, userEmail: string): Promise<string[]> {
  const [{ id }] = await query<{ id: string }>("SELECT id FROM users WHERE email = $1", [userEmail]);
  return outboxStatesOf(page, id);
}

/** The bolt and pass the confirm offers now. */
async function offered(page: Page): Promise<{ pass: number; bolt: number }> {
  const name = (await page.getByTestId("torque-confirm").textContent())!;
  const m = name.match(/Bolt (\d+) of 10 — pass (\d) of/)!;
  return { bolt: Number(m[1]), pass: Number(m[2]) };
}

async function tapConfirm(page: Page) {
  const confirm = page.getByTestId("torque-confirm");
  await expect(confirm).toBeEnabled();
  const before = await offered(page);
  await confirm.click();
  await expect.poll(() => offered(page).then((o) => `${o.pass}:${o.bolt}`)).not.toBe(`${before.pass}:${before.bolt}`);
  return before;
}

test("the network cut between the sync answer and the job reload: the screen never offers a bolt already on the server, and the outbox keeps the work until a fresh copy is stored", async ({
  page,
  context,
}) => {
  page.on("pageerror", (e) => console.log(`[page error] ${e.message}`));
  const mechanic = await signIn(page, "mechanic");
  await waitForServiceWorker(page);
  await waitForSynced(page);
  await openHeadBolts(page);
  await page.getByRole("button", { name: "I have read these cautions" }).click();

  await context.setOffline(true);
  const tapped = [await tapConfirm(page), await tapConfirm(page)];
  await expect(page.getByTestId("waiting-count")).toHaveText("2 waiting to send");

  // The sync answer gets through; every job reload after it fails, as when the Wi-Fi drops between them.
  const jobReload = /\/api\/bench\/jobs\/[0-9a-f-]{36}$/;
  let reloadsCut = 0;
  await context.route(jobReload, (route) => {
    reloadsCut++;
    return route.abort("internetdisconnected");
  });
  const syncAnswered = page.waitForResponse((r) => r.url().endsWith("/api/sync") && r.status() === 200);
  await context.setOffline(false);
  await syncAnswered;
  await expect(page.getByTestId("copy-older")).toContainText("older than the last sync");
  expect(reloadsCut).toBeGreaterThan(0);
  await expect(page.getByTestId("waiting-count")).toHaveText("Nothing waiting to send");

  const onServer = await headBoltRecords();
  for (const t of tapped) expect(onServer).toContainEqual({ pass_index: t.pass, bolt: t.bolt, n: 1 });
  const isOnServer = (o: { pass: number; bolt: number }) => onServer.some((r) => r.pass_index === o.pass && r.bolt === o.bolt);
  expect(isOnServer(await offered(page))).toBe(false);
  expect(await outboxStates(page, mechanic.email)).toEqual(["sent", "sent"]);
  await page.screenshot({ path: test.info().outputPath("older-copy.png") });

  // Reloaded with the reload still cut: the sent work is still drawn, from the outbox.
  await page.reload();
  await expect(page.getByTestId("step-title")).toHaveText("Torque head bolts");
  await expect(page.getByTestId("copy-older")).toBeVisible();
  expect(isOnServer(await offered(page))).toBe(false);
  expect(await outboxStates(page, mechanic.email)).toEqual(["sent", "sent"]);

  // The reload gets through: the fresh copy holds the bolts, and only then do they leave the outbox.
  await context.unroute(jobReload);
  // The bench retries the reload on its own as well; the button only hurries it, and may be gone
  // (the fresh copy stored) before the tap lands.
  await page
    .getByRole("button", { name: "Refresh now" })
    .click({ timeout: 5_000 })
    .catch(() => undefined);
  await expect(page.getByTestId("copy-older")).toHaveCount(0);
  await expect.poll(() => outboxStates(page, mechanic.email)).toEqual([]);
  expect(isOnServer(await offered(page))).toBe(false);
  expect(await headBoltRecords()).toEqual(onServer);
});

test("a double tap records one bolt; taps on the bolt drawing record nothing", async ({ page }) => {
  await signIn(page, "mechanic");
  await waitForSynced(page);
  await openHeadBolts(page);
  await page.getByRole("button", { name: "I have read these cautions" }).click();
  const before = await headBoltRecords();
  const shown = await offered(page);

  // A resting palm or a tap on the drawing: it shows where you are, it does not confirm.
  await page.locator(`[data-bolt="${shown.bolt}"]`).click();
  await page.getByTestId("bolt-drawing").click({ position: { x: 20, y: 20 } });
  await page.waitForTimeout(700);
  await expect(page.getByTestId("waiting-count")).toHaveText("Nothing waiting to send");
  expect(await offered(page)).toEqual(shown);

  // Two pointer presses 60 ms apart on the confirm: one bolt.
  const box = (await page.getByTestId("torque-confirm").boundingBox())!;
  const [x, y] = [box.x + box.width / 2, box.y + box.height / 2];
  await page.mouse.click(x, y);
  await page.waitForTimeout(60);
  await page.mouse.click(x, y);
  await expect(page.getByTestId("waiting-count")).toHaveText("1 waiting to send");
  await page.waitForTimeout(700);
  await expect(page.getByTestId("waiting-count")).toHaveText("1 waiting to send");
  await waitForSynced(page);
  const after = await headBoltRecords();
  expect(after).toEqual(
    [...before, { pass_index: shown.pass, bolt: shown.bolt, n: 1 }].sort((a, b) => a.pass_index - b.pass_index || a.bolt - b.bolt),
  );
});

test("the bolt fixed when the finger goes down is the one recorded, even when another tablet's work arrives before release", async ({
  page,
  browser,
}) => {
  await signIn(page, "mechanic");
  await waitForSynced(page);
  await openHeadBolts(page);
  await page.getByRole("button", { name: "I have read these cautions" }).click();
  const shown = await offered(page);

  const box = (await page.getByTestId("torque-confirm").boundingBox())!;
  await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
  await page.mouse.down();

  // Meanwhile the supervisor's tablet records that very bolt, and this tablet syncs it in.
  const supervisor = demoUser("supervisor");
  const [ids] = await query<{ job: string; step: string; spec: string; author: string }>(
    `SELECT w.id AS job, s.id AS step, t.id AS spec, u.id AS author FROM work_orders w
     JOIN job_procedures jp ON jp.work_order_id = w.id JOIN template_steps s ON s.template_version_id = jp.template_version_id AND s.key = 'head-bolts'
     JOIN torque_specs t ON t.step_id = s.id JOIN users u ON u.email = $1 WHERE w.number = 1006`,
    [supervisor.email],
  );
  const other = await browser.newContext();
  const otherPage = await other.newPage();
  await signIn(otherPage, "supervisor");
  const now = Date.now();
  const res = await otherPage.request.post("/api/sync", {
    headers: fromOurPage,
    data: {
      deviceId: "tab-supervisor-e2e",
      cursor: null,
      operations: [
        {
          id: randomUUID(),
          kind: "torque.bolt-confirmed",
          workOrderId: ids.job,
          authorId: ids.author,
          deviceId: "tab-supervisor-e2e",
          deviceTime: new Date(now).toISOString(),
          stamp: formatStamp({ wallMs: now, counter: 0, deviceId: "tab-supervisor-e2e" }),
          payload: { stepId: ids.step, torqueSpecId: ids.spec, passIndex: shown.pass, bolt: shown.bolt },
        },
      ],
    },
  });
  expect((await res.json()).accepted).toHaveLength(1);
  await other.close();
  await page.getByRole("button", { name: "Sync now" }).dispatchEvent("click");
  await expect.poll(() => offered(page).then((o) => `${o.pass}:${o.bolt}`)).not.toBe(`${shown.pass}:${shown.bolt}`);

  // Release: the tap records what the screen showed when the finger went down.
  await page.mouse.up();
  await expect(page.getByTestId("waiting-count")).toHaveText("1 waiting to send");
  await waitForSynced(page);
  const rows = await query<{ email: string }>(
    `SELECT u.email FROM torque_records t JOIN users u ON u.id = t.recorded_by JOIN template_steps s ON s.id = t.step_id
     JOIN work_orders w ON w.id = t.work_order_id WHERE w.number = 1006 AND s.key = 'head-bolts' AND t.pass_index = $1 AND t.bolt = $2 ORDER BY u.email`,
    [shown.pass, shown.bolt],
  );
  expect(rows.map((r) => r.email).sort()).toEqual([demoUser("supervisor").email, demoUser("mechanic").email].sort());
});

test("overlapping sync triggers run one at a time and never leave an older job copy", async ({ page, context }) => {
  const mechanic = await signIn(page, "mechanic");
  await waitForSynced(page);
  await openHeadBolts(page);
  await page.getByRole("button", { name: "I have read these cautions" }).click();

  // Slow answers widen every window in which two runs could overlap.
  let inFlight = 0;
  let most = 0;
  const copies: string[] = [];
  await context.route(/\/api\/(sync|bench\/jobs\/[0-9a-f-]{36})$/, async (route) => {
    inFlight++;
    most = Math.max(most, inFlight);
    try {
      const response = await route.fetch();
      await new Promise((r) => setTimeout(r, 250));
      if (route.request().url().includes("/api/bench/jobs/")) copies.push(String((await response.json()).cursor));
      await route.fulfill({ response });
    } finally {
      inFlight--;
    }
  });
  // Saves, the online event and the button, all at once and again.
  for (let i = 0; i < 3; i++) {
    await tapConfirm(page);
    await page.evaluate(() => window.dispatchEvent(new Event("online")));
    await page.getByRole("button", { name: "Sync now" }).dispatchEvent("click");
  }
  await waitForSynced(page);
  await expect.poll(() => outboxStates(page, mechanic.email)).toEqual([]);
  expect(most).toBe(1);
  expect(copies.length).toBeGreaterThan(0);
  const [{ id }] = await query<{ id: string }>("SELECT id FROM users WHERE email = $1", [mechanic.email]);
  const [held] = await page.evaluate(
    ([name, job]) =>
      new Promise<string[]>((resolve) => {
        const req = indexedDB.open(name);
        req.onsuccess = () => {
          const get = req.result.transaction("jobs").objectStore("jobs").get(job);
          get.onsuccess = () => resolve([String(get.result.snapshot.cursor)]);
        };
      }),
    [`benchtag-bench-${id}`, (await query<{ id: string }>("SELECT id FROM work_orders WHERE number = 1006"))[0].id] as const,
  );
  expect(BigInt(held)).toBe(copies.map(BigInt).reduce((a, b) => (a > b ? a : b)));
  await context.unrouteAll({ behavior: "wait" }); // a run the 20 s timer started may still be in the slow route
});

test("after an offline reload, the sync starts within 2 s of the network returning", async ({ page, context }) => {
  await signIn(page, "mechanic");
  await waitForServiceWorker(page);
  await waitForSynced(page);
  await openHeadBolts(page);
  await page.getByRole("button", { name: "I have read these cautions" }).click();
  await context.setOffline(true);
  const tapped = await tapConfirm(page);
  await expect(page.getByTestId("waiting-count")).toHaveText("1 waiting to send");

  // Measured in the page: from the browser's online event to the first sync request after it.
  await page.addInitScript(() => {
    const w = window as unknown as { onlineAt: number | null; syncAt: number[] };
    w.onlineAt = null;
    w.syncAt = [];
    window.addEventListener("online", () => (w.onlineAt = performance.now()));
    const send = window.fetch.bind(window);
    window.fetch = (input, init) => {
      const url = typeof input === "string" ? input : input instanceof URL ? input.href : input.url;
      if (url.endsWith("/api/sync")) w.syncAt.push(performance.now());
      return send(input, init);
    };
  });
  await page.reload();
  await expect(page.getByTestId("net-state")).toHaveText(/Offline/);
  await expect(page.getByTestId("step-title")).toHaveText("Torque head bolts");
  await page.waitForTimeout(2500); // long enough for a tablet that thinks it is online to have tried and failed
  await context.setOffline(false);
  const gap = await page
    .waitForFunction(
      () => {
        const w = window as unknown as { onlineAt: number | null; syncAt: number[] };
        const after = w.onlineAt === null ? undefined : w.syncAt.find((t) => t >= w.onlineAt!);
        return after === undefined ? false : after - w.onlineAt!;
      },
      undefined,
      { timeout: 20_000 },
    )
    .then((h) => h.jsonValue());
  console.log(`sync started ${Math.round(gap as number)} ms after the online event`);
  expect(gap).toBeLessThan(2000);
  await expect(page.getByTestId("waiting-count")).toHaveText("Nothing waiting to send", { timeout: 10_000 });
  expect(await headBoltRecords()).toContainEqual({ pass_index: tapped.pass, bolt: tapped.bolt, n: 1 });
});

test("no /api/ answer is kept in any cache; signing out names the unsent work, clears the bench pages and keeps that work", async ({
  page,
  context,
}) => {
  const mechanic = await signIn(page, "mechanic");
  await waitForServiceWorker(page);
  await waitForSynced(page);
  await openHeadBolts(page);
  await page.getByRole("button", { name: "I have read these cautions" }).click();
  const cached = () =>
    page.evaluate(async () => {
      const out: string[] = [];
      for (const name of await caches.keys())
        for (const r of await (await caches.open(name)).keys()) out.push(`${name} ${new URL(r.url).pathname}`);
      return out;
    });
  const before = await cached();
  expect(before.filter((e) => e.includes(" /api/"))).toEqual([]);
  expect(before).toContain("bench-pages /bench");

  // Work the server has not got yet (its sync is held back) stays on the tablet through a sign-out.
  await context.route("**/api/sync", (route) => route.abort("internetdisconnected"));
  const tapped = await tapConfirm(page);
  await expect(page.getByTestId("waiting-count")).toHaveText("1 waiting to send");
  // signing out names the work not yet sent first; staying keeps the bench as it is
  await page.getByRole("button", { name: "Sign out" }).click();
  await expect(page.getByTestId("unsent-before-sign-out")).toHaveText(
    "1 piece of work on this tablet is not with the server yet. It stays here and is sent only when you sign in on this tablet again.",
  );
  await page.getByRole("button", { name: "Stay signed in" }).click();
  await expect(page.getByTestId("unsent-before-sign-out")).toHaveCount(0);
  await expect(page.getByTestId("bench-root")).toBeVisible();
  await page.getByRole("button", { name: "Sign out" }).click();
  await page.getByRole("button", { name: "Sign out anyway" }).click();
  await expect(page).toHaveURL(/\/signin/);
  const after = await cached();
  expect(after.filter((e) => e.includes(" /api/") || e.startsWith("bench-pages") || e.endsWith(" /bench"))).toEqual([]);
  expect(await outboxStates(page, mechanic.email)).toEqual(["waiting"]);

  await context.unroute("**/api/sync");
  await signIn(page, "mechanic");
  await waitForSynced(page);
  expect(await headBoltRecords()).toContainEqual({ pass_index: tapped.pass, bolt: tapped.bolt, n: 1 });
});
