import { expect, test } from "@playwright/test";
import { signIn } from "./support/demo-users";
import { fromOurPage } from "./support/same-origin";

const NO_ID = "00000000-0000-4000-8000-000000000000";
const OFFICE_ROUTES: Array<[method: "GET" | "POST" | "PUT", path: string]> = [
  ["GET", "/api/office/work-orders"],
  ["POST", "/api/office/work-orders"],
  ["GET", `/api/office/work-orders/${NO_ID}`],
  ["GET", `/api/office/work-orders/${NO_ID}/progress`],
  ["POST", `/api/office/work-orders/${NO_ID}/status`],
  ["POST", `/api/office/work-orders/${NO_ID}/assign`],
  ["POST", `/api/office/work-orders/${NO_ID}/notes`],
  ["PUT", `/api/office/work-orders/${NO_ID}/quote`],
  ["POST", `/api/office/work-orders/${NO_ID}/quote/send`],
  ["POST", `/api/office/work-orders/${NO_ID}/parts`],
  ["GET", "/api/office/customers"],
  ["POST", "/api/office/customers"],
  ["GET", `/api/office/customers/${NO_ID}`],
  ["PUT", `/api/office/customers/${NO_ID}`],
  ["GET", "/api/office/bikes"],
  ["POST", "/api/office/bikes"],
  ["GET", "/api/office/parts?code=KP-24-1187"],
];
const TEMPLATE_ROUTES: Array<[method: "GET" | "POST", path: string]> = [
  ["GET", "/api/office/templates"],
  ["POST", "/api/office/templates"],
  ["GET", "/api/office/templates/bottom-end-assembly"],
  ["POST", "/api/office/templates/import"],
];

for (const who of ["mechanic", "customer"] as const) {
  test(`a ${who} is refused every office route with 403 and no data`, async ({ page }) => {
    await signIn(page, who);
    for (const [method, path] of [...OFFICE_ROUTES, ...TEMPLATE_ROUTES]) {
      const res = await page.request.fetch(path, { method, data: method === "GET" ? undefined : {}, headers: fromOurPage });
      expect(res.status(), `${method} ${path}`).toBe(403);
      const text = await res.text();
      expect(text, `${method} ${path}`).not.toMatch(/GSW-|Gannet|@example\.test/);
    }
    for (const path of ["/office/customers", "/office/templates", "/office/parts", "/office/labels", "/office/work-orders/new"]) {
      await page.goto(path);
      await expect(page).toHaveURL(/\?refused=/);
    }
  });
}

test("a customer can approve only their own quote", async ({ browser }) => {
  // the office finds the quote of work order 1003 (Felix's Halden, waiting for approval)
  const office = await (await browser.newContext()).newPage();
  await signIn(office, "office");
  const list = await (await office.request.get("/api/office/work-orders?q=1003")).json();
  const wo = list.workOrders.find((w: { number: number }) => w.number === 1003);
  const detail = await (await office.request.get(`/api/office/work-orders/${wo.id}`)).json();
  const quoteId = detail.quotes[0].id as string;

  const ruth = await (await browser.newContext()).newPage();
  await signIn(ruth, "customer2");
  const refused = await ruth.request.post(`/api/my-bikes/quotes/${quoteId}/approve`, { headers: fromOurPage });
  expect(refused.status()).toBe(403);
  expect(await refused.json()).toEqual({ error: "This quote is not yours to approve.", issues: [] });
  const depositRefused = await ruth.request.post(`/api/my-bikes/quotes/${quoteId}/deposit`, { headers: fromOurPage });
  expect(depositRefused.status()).toBe(403);
  // the office cannot approve on the customer's behalf either
  expect((await office.request.post(`/api/my-bikes/quotes/${quoteId}/approve`, { headers: fromOurPage })).status()).toBe(403);
  const after = await (await office.request.get(`/api/office/work-orders/${wo.id}`)).json();
  expect(after.quotes[0].status).toBe("sent");
  expect(after.workOrder.status).toBe("quoted");
});

test("bike records: a mechanic sees the history but not the owner's contact details; a supervisor sees both", async ({ browser }) => {
  const office = await (await browser.newContext()).newPage();
  await signIn(office, "office");
  const bikes = await (await office.request.get("/api/office/bikes?q=GSW-0001")).json();
  const id = bikes.bikes[0].id as string;

  const mech = await (await browser.newContext()).newPage();
  await signIn(mech, "mechanic");
  await mech.goto(`/office/bikes/${id}`);
  await expect(mech.getByRole("heading", { level: 1 })).toContainText("Corvid RX1000 Turbo");
  await expect(mech.getByTestId("bike-work-order")).toHaveCount(1);
  await expect(mech.getByText("KP-24-1187")).toBeVisible();
  await expect(mech.getByTestId("owner-email")).toHaveCount(0);
  await expect(mech.getByText("felix.amadi@example.test")).toHaveCount(0);

  const sup = await (await browser.newContext()).newPage();
  await signIn(sup, "supervisor");
  await sup.goto(`/office/bikes/${id}`);
  await expect(sup.getByTestId("owner-email")).toHaveText("felix.amadi@example.test");
  await expect(sup.getByTestId("tag-qr")).toContainText("GSW-0001");
  // supervisors author templates but do not run the office
  await sup.goto("/office/templates");
  await expect(sup.getByRole("heading", { level: 1, name: "Procedure templates" })).toBeVisible();
  await sup.goto("/office");
  await expect(sup).toHaveURL(/\/review\?refused=office/);
});

test("bad input to an office route is a specific 400, not a server error", async ({ page }) => {
  await signIn(page, "office");
  const r = await page.request.post("/api/office/customers", { data: { name: "X", email: "not-an-address" }, headers: fromOurPage });
  expect(r.status()).toBe(400);
  const body = await r.json();
  expect(body.issues).toEqual(
    expect.arrayContaining([
      { path: "name", message: "enter the customer's name" },
      { path: "email", message: "enter a valid e-mail address, or leave it empty" },
    ]),
  );
  const notJson = await page.request.post("/api/office/customers", {
    headers: { "content-type": "application/json", ...fromOurPage },
    data: Buffer.from("{oops"),
  });
  expect(notJson.status()).toBe(400);
  expect((await notJson.json()).error).toMatch(/^The body is not valid JSON: /);
  const badId = await page.request.get("/api/office/work-orders/not-a-uuid");
  expect(badId.status()).toBe(404);
});
