import AxeBuilder from "@axe-core/playwright";
import { expect, test, type Page } from "@playwright/test";
import { query } from "./support/e2e-db";
import { signIn } from "./support/demo-users";
import { fromOurPage } from "./support/same-origin";

// The review and audit pages: the demo job #1001's head-prep sign-off waiting in the queue, the
// review screen's record of it, role refusals on every page and route, clear answers to bad input,
// accessibility, and screenshots at both tablet sizes (test-results/review-screens/).

async function axe(page: Page, name: string) {
  const result = await new AxeBuilder({ page }).withTags(["wcag2a", "wcag2aa", "wcag21aa"]).analyze();
  expect(result.violations.map((v) => `${name}: ${v.id} (${v.nodes.length}) ${v.help}`)).toEqual([]);
}

async function headPrepSignOff(): Promise<string> {
  const [row] = await query<{ id: string }>(
    "SELECT s.id FROM sign_offs s JOIN work_orders w ON w.id = s.work_order_id WHERE w.number = 1001 AND s.stage_key = 'head-prep'",
  );
  return row.id;
}

for (const viewport of [
  { width: 1024, height: 768 },
  { width: 768, height: 1024 },
]) {
  test(`supervisor: demo sign-off in the queue, its full record, the audit page (${viewport.width}×${viewport.height})`, async ({
    page,
  }) => {
    await page.setViewportSize(viewport);
    const shot = (name: string) =>
      page.screenshot({ path: `test-results/review-screens/${name}-${viewport.width}x${viewport.height}.png`, fullPage: false });
    await signIn(page, "supervisor");
    await expect(page).toHaveURL(/\/review$/);
    await expect(page.getByTestId("review-count")).toHaveText(/^[1-9]\d* waiting for review$/);
    const row = page.getByTestId("review-queue").getByRole("row").filter({ hasText: "#1001" });
    await expect(row).toContainText("Prepare deck and head");
    await expect(row).toContainText("Corvid RX1000 Turbo");
    await expect(row).toContainText("Tomas Reyes");
    // The bottom-end stages of #1001 were approved in the demo: not waiting.
    await expect(
      page.getByTestId("review-queue").getByRole("row").filter({ hasText: "Measure before assembly" }).filter({ hasText: "#1001" }),
    ).toHaveCount(0);
    // Filters: a job number, a bike search and the signer, all answered by the server.
    await page.getByLabel("Job number").fill("1001");
    await expect(page.getByTestId("review-queue-page")).toContainText("1 in all");
    await page.getByLabel("Bike (tag, make or model)").fill("Marlin");
    await expect(page.getByTestId("review-queue")).toContainText("Nothing matches.");
    await page.getByLabel("Bike (tag, make or model)").fill("GSW-0001");
    await expect(row).toBeVisible();
    await page.getByLabel("Job number").fill("10x");
    await expect(page.getByText("✖ digits only")).toBeVisible();
    await page.getByLabel("Job number").fill("1001");
    await axe(page, "queue");
    await shot("queue");

    await row.getByRole("link", { name: /Review #1001/ }).click();
    await expect(page.getByRole("heading", { level: 1 })).toHaveText("Prepare deck and head");
    await expect(page.getByTestId("review-summary")).toHaveText("2 steps · every reading in tolerance");
    const deck = page.getByTestId("review-step").filter({ hasText: "Piston deck clearance" });
    await expect(deck.getByTestId("reading-row")).toHaveCount(4);
    await expect(deck.getByTestId("reading-row").first()).toContainText("0.18 mm");
    await expect(deck).toContainText("Done by Tomas Reyes");
    await expect(page.getByRole("region", { name: "Decision" })).toBeVisible();
    await axe(page, "review screen");
    await shot("review-screen");
    await page.getByRole("radio", { name: "↺ Send back" }).check();
    await expect(page.getByRole("group", { name: "Steps to reopen" }).getByRole("checkbox")).toHaveCount(2);
    await shot("send-back-form");

    await page.getByRole("link", { name: "Audit trail of job #1001" }).click();
    await expect(page.getByTestId("audit-table")).toContainText("sync.stage.signed-off");
    await page.getByLabel("Outcome").selectOption("refused");
    await expect(page.getByTestId("audit-table-page")).toContainText(/\d+ in all/);
    await page.getByLabel("Outcome").selectOption("");
    // The download's days: a range that runs backwards is said at once and not offered.
    await page.getByLabel("From", { exact: true }).fill("2026-03-10");
    await page.getByLabel("To", { exact: true }).fill("2026-03-01");
    await expect(page.getByTestId("audit-export-problem")).toHaveText(
      "✖ To: 2026-03-01 comes before From (2026-03-10); To is the last day",
    );
    await expect(page.getByTestId("audit-export")).toHaveCount(0);
    await page.getByLabel("To", { exact: true }).fill("2026-03-31");
    await expect(page.getByTestId("audit-export")).toHaveAttribute("href", /from=2026-03-10&to=2026-03-31/);
    await axe(page, "audit");
    await shot("audit");
  });
}

test("mechanics and customers reach neither the review nor the audit pages nor their routes; nobody signed out does", async ({
  page,
  request,
}) => {
  const signOffId = await headPrepSignOff();
  const routes = (id: string) => [
    { method: "GET", url: "/api/review/queue" },
    { method: "GET", url: "/api/review/count" },
    { method: "GET", url: `/api/review/sign-offs/${id}` },
    { method: "POST", url: `/api/review/sign-offs/${id}/decisions`, body: { decision: "approved", expectedDecisionId: null } },
    { method: "GET", url: "/api/audit" },
    { method: "GET", url: "/api/audit/export" },
  ];
  for (const r of routes(signOffId)) {
    const res = r.method === "GET" ? await request.get(r.url) : await request.post(r.url, { data: r.body, headers: fromOurPage });
    expect(res.status(), `${r.method} ${r.url} signed out`).toBe(401);
  }
  for (const key of ["mechanic", "customer"] as const) {
    await page.context().clearCookies();
    const u = await signIn(page, key);
    for (const path of ["/review", `/review/${signOffId}`, "/audit"]) {
      await page.goto(path);
      await expect(page).toHaveURL(key === "mechanic" ? /\/bench\?refused=/ : /\/my-bikes\?refused=/);
    }
    await expect(page.getByRole("link", { name: "Review" })).toHaveCount(0);
    await expect(page.getByRole("link", { name: "Audit log" })).toHaveCount(0);
    for (const r of routes(signOffId)) {
      const res =
        r.method === "GET" ? await page.request.get(r.url) : await page.request.post(r.url, { data: r.body, headers: fromOurPage });
      expect(res.status(), `${r.method} ${r.url} as ${u.key}`).toBe(403);
      const body = await res.json();
      expect(body).toEqual({ error: `Your role (${u.role}) may not use this.`, issues: [] });
    }
  }
  const decisions = await query("SELECT count(*)::int AS n FROM review_decisions WHERE sign_off_id = $1", [signOffId]);
  expect(decisions[0].n).toBe(0);
});

test("bad input to the review routes gets a clear answer naming the problem, never a server error", async ({ page }) => {
  const signOffId = await headPrepSignOff();
  await signIn(page, "office");
  const post = (data: unknown) =>
    page.request.post(`/api/review/sign-offs/${signOffId}/decisions`, { data: data as object, headers: fromOurPage });

  const noReason = await post({ decision: "sent_back", expectedDecisionId: null, seenUpTo: "1", reason: "", reopenStepIds: [] });
  expect(noReason.status()).toBe(400);
  const issues = (await noReason.json()).issues as Array<{ path: string; message: string }>;
  expect(issues.map((i) => i.path).sort()).toEqual(["reason", "reopenStepIds"]);

  // a decision that does not say which record the screen showed is not taken
  const unsaid = await post({ decision: "approved", expectedDecisionId: null });
  expect(unsaid.status()).toBe(400);
  expect((await unsaid.json()).issues).toEqual([
    { path: "seenUpTo", message: "Reload the review and decide again: this decision does not say which record you saw." },
  ]);

  const odd = await post({ decision: "maybe" });
  expect(odd.status()).toBe(400);
  expect((await odd.json()).issues[0]).toMatchObject({ path: "decision", message: "Choose approve or send back." });

  const notJson = await page.request.post(`/api/review/sign-offs/${signOffId}/decisions`, {
    data: Buffer.from("{not json"),
    headers: { "content-type": "application/json", ...fromOurPage },
  });
  expect(notJson.status()).toBe(400);
  expect((await notJson.json()).error).toMatch(/^The body is not valid JSON: /);

  expect((await page.request.get("/api/review/sign-offs/not-an-id")).status()).toBe(404);
  expect((await page.request.get("/api/review/sign-offs/00000000-0000-4000-8000-000000000000")).status()).toBe(404);
  const badJob = await page.request.get("/api/review/queue?job=12a");
  expect(badJob.status()).toBe(400);
  expect((await badJob.json()).issues[0]).toMatchObject({ path: "job", message: "The job must be a work order number" });
  const badOutcome = await page.request.get("/api/audit/export?outcome=perhaps");
  expect(badOutcome.status()).toBe(400);
  expect((await badOutcome.json()).issues[0].message).toBe("The outcome must be accepted or refused");

  // The office may read the queue and the audit log; the count matches the queue's total.
  const queue = await (await page.request.get("/api/review/queue?size=100")).json();
  const count = await (await page.request.get("/api/review/count")).json();
  expect(count.waiting).toBe(queue.total);
  expect(queue.signOffs.map((s: { signOffId: string }) => s.signOffId)).toContain(signOffId);
  // A download's range: refused with the reason when it runs backwards, leaves 2000–2099 or covers over a year.
  for (const [range, message] of [
    ["from=2026-03-10&to=2026-03-01", "To: 2026-03-01 comes before From (2026-03-10); To is the last day"],
    ["from=1999-12-31&to=2000-01-02", "From: a date in the years 2000 to 2099"],
    [
      "from=2024-01-01&to=2025-01-01",
      "Dates: at most one year (366 days) at a time, and 2024-01-01 to 2025-01-01 is 367 days; download a longer stretch a year at a time",
    ],
  ]) {
    const refused = await page.request.get(`/api/audit/export?${range}`);
    expect(refused.status()).toBe(400);
    expect((await refused.json()).issues.map((i: { message: string }) => i.message)).toEqual([message]);
  }
  const csv = await page.request.get("/api/audit/export?job=1001");
  expect(csv.status()).toBe(200);
  expect((await csv.text()).split("\r\n")[0]).toBe(
    "entry,logged_at,work_order,actor_name,actor_email,actor_role,device,action,entity,entity_id,outcome,reason,detail_json",
  );
  // None of the refused requests above changed anything.
  const decisions = await query("SELECT count(*)::int AS n FROM review_decisions WHERE sign_off_id = $1", [signOffId]);
  expect(decisions[0].n).toBe(0);
});
