import { expect, test, type Page } from "@playwright/test";
import { signIn } from "./support/demo-users";
import { query } from "./support/e2e-db";
import { goByHeader } from "./support/nav";

// Templates import/export, parts search, tag labels, and a look at each office page at the two
// tablet sizes (screenshots kept in test-results/office-screens for a person to look at).

async function noSideScroll(page: Page) {
  const over = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
  expect(over).toBeLessThanOrEqual(0);
}

test("templates: export, a bad import refused with path and message, a good import makes a new version", async ({ page }) => {
  await signIn(page, "office");
  await goByHeader(page, "Templates");
  await expect(page.getByTestId("template")).toHaveCount(4);
  await expect(page.getByTestId("template").filter({ hasText: "First start and run-in" })).toContainText("Example figures");

  const exported = await (await page.request.get("/api/office/templates/turbo-kit-intercooler")).json();
  expect(exported).toMatchObject({ format: "benchtag-template", formatVersion: 1, key: "turbo-kit-intercooler", exampleOnly: true });

  const bad = structuredClone(exported);
  bad.stages[1].steps[0].torque[0].boltCount = 0;
  await page
    .getByLabel("Template file (.json)")
    .setInputFiles({ name: "bad.json", mimeType: "application/json", buffer: Buffer.from(JSON.stringify(bad)) });
  await page.getByRole("button", { name: "Import" }).click();
  await expect(page.getByTestId("form-error")).toHaveText("The file was not imported: nothing was written.");
  await expect(page.getByTestId("import-problems")).toContainText("stages[1].steps[0].torque[0].boltCount:");

  const good = { ...exported, name: "Turbo kit and intercooler fitting (shop edition)" };
  await page
    .getByLabel("Template file (.json)")
    .setInputFiles({ name: "good.json", mimeType: "application/json", buffer: Buffer.from(JSON.stringify(good)) });
  await page.getByRole("button", { name: "Import" }).click();
  await expect(page.getByTestId("form-ok")).toHaveText("✔ Imported: turbo-kit-intercooler (version 2).");
  await expect(page.getByRole("heading", { name: "Turbo kit and intercooler fitting (shop edition)" })).toBeVisible();
});

test("template editor: the structured form and the JSON view are checked as they are edited", async ({ page }) => {
  await signIn(page, "office");
  await page.goto("/office/templates/edit?key=first-start-run-in");
  // the demo template has 2 + 5 + 2 + 2 steps, one torque spec, one measurement spec, three timers
  await expect(page.getByTestId("template-valid")).toContainText("4 stages, 11 steps, 1 torque specs, 1 measurement specs, 3 timers");

  // form: a negative timer is named beside the field and in the list, and blocks saving
  const step = page.locator("details").filter({ hasText: "Step 2: Heat cycle 1" });
  await step.locator("summary").click();
  await step.getByLabel("Duration (seconds)").fill("-5");
  await expect(page.getByTestId("template-problems")).toContainText("stages[1].steps[1].timer.durationS:");
  await expect(step.getByText("✖ Duration: must be more than 0")).toBeVisible();
  await expect(page.getByRole("button", { name: "Save as a new version" })).toBeDisabled();
  await step.getByLabel("Duration (seconds)").fill("5400");
  await page.getByLabel("Name", { exact: true }).fill("First start and run-in (our shop)");
  await expect(page.getByTestId("template-valid")).toBeVisible();

  // JSON view of the same document; a bad edit is refused with its path
  await page.getByRole("tab", { name: "JSON" }).click();
  const box = page.getByTestId("template-json");
  const text = await box.inputValue();
  expect(JSON.parse(text).stages[1].steps[1].timer.durationS).toBe(5400);
  await box.fill(text.replace('"unit": "N·m"', '"unit": "ft-lb"'));
  await expect(page.getByTestId("template-problems")).toContainText("stages[1].steps[4].torque[0].unit:");
  await box.fill(text);
  await page.getByRole("tab", { name: "Form" }).click();
  await page.getByRole("button", { name: "Save as a new version" }).click();
  await expect(page.getByTestId("form-ok")).toHaveText("✔ Saved as version 2.");
  const saved = await (await page.request.get("/api/office/templates/first-start-run-in?version=2")).json();
  expect(saved.name).toBe("First start and run-in (our shop)");
  expect(saved.stages[1].steps[1].timer.durationS).toBe(5400);
});

test("work-order table: sorting, filtering and paging come from the server", async ({ page }) => {
  // other specs in the run may add work orders, so this checks order and consistency, not counts
  await signIn(page, "office");
  const table = page.getByTestId("work-orders-table");
  const rows = table.locator("tbody tr");
  await expect(rows.first()).toContainText("10");
  const numbers = (await rows.locator("td:first-child").allInnerTexts()).map(Number);
  expect(numbers).toEqual([...numbers].sort((a, b) => b - a)); // newest first
  const sorted = page.waitForResponse((r) => r.url().includes("sort=customer") && r.url().includes("dir=asc"));
  await table.getByRole("button", { name: /Customer/ }).click();
  await sorted;
  await expect(table.locator("th[aria-sort=ascending]")).toContainText("Customer");
  await expect
    .poll(async () => {
      const names = await rows.locator("td:nth-child(3)").allInnerTexts();
      return names.length > 1 && names.join("|") === [...names].sort((a, b) => a.localeCompare(b)).join("|");
    })
    .toBe(true);
  await table.getByLabel("Status").selectOption("in_build");
  await expect(rows.filter({ hasText: "Handed over" })).toHaveCount(0);
  await expect(rows.filter({ hasText: "In build" }).first()).toBeVisible();
  await table.getByLabel(/Search/).fill("ostrava");
  await expect(rows).toHaveCount(1);
  await expect(rows).toContainText("1002");
  // pages of two, put together, are the whole list in the same order
  const all = await (await page.request.get("/api/office/work-orders?size=100&sort=number&dir=asc")).json();
  const pieces: number[] = [];
  for (let p = 0; p * 2 < all.total; p++) {
    const part = await (await page.request.get(`/api/office/work-orders?size=2&page=${p}&sort=number&dir=asc`)).json();
    expect(part.workOrders.length).toBeLessThanOrEqual(2);
    pieces.push(...part.workOrders.map((w: { number: number }) => w.number));
  }
  expect(all.total).toBeGreaterThanOrEqual(5);
  expect(pieces).toEqual(all.workOrders.map((w: { number: number }) => w.number));
});

test("parts search answers which bikes got a batch", async ({ page }) => {
  await signIn(page, "office");
  await page.getByRole("link", { name: "Parts", exact: true }).click();
  await page.getByLabel("Code").fill("rs-24-0412");
  await page.getByRole("button", { name: "Find bikes" }).click();
  const results = page.getByTestId("parts-results");
  await expect(results).toContainText("2 bikes, 2 fittings");
  await expect(results).toContainText("GSW-0001");
  await expect(results).toContainText("GSW-0005");
});

test("tag labels: a printable A4 sheet with a QR code and the tag code per bike", async ({ page }) => {
  await signIn(page, "office");
  await goByHeader(page, "Labels");
  await expect(page.getByRole("heading", { level: 1, name: "Tag labels" })).toBeVisible();
  const labels = page.getByTestId("tag-label");
  expect(await labels.count()).toBeGreaterThanOrEqual(5);
  await expect(labels.first()).toContainText("GSW-0001");
  await expect(labels.first().locator("svg")).toHaveCount(1);
  // the sheet is 210 mm wide: at 96 px per inch that is ~794 px
  const width = await page
    .getByTestId("label-sheet")
    .first()
    .evaluate((el) => el.getBoundingClientRect().width);
  expect(Math.round(width)).toBe(794);
  await page.emulateMedia({ media: "print" });
  await expect(page.getByRole("button", { name: "Print the sheet" })).toBeHidden();
  await page.screenshot({ path: "test-results/office-screens/labels-print.png", fullPage: true });
});

for (const size of [
  { width: 1024, height: 768 },
  { width: 768, height: 1024 },
]) {
  test(`office pages fit a ${size.width}×${size.height} screen`, async ({ page }) => {
    await page.setViewportSize(size);
    await signIn(page, "office");
    const list = await (await page.request.get("/api/office/work-orders?q=1001")).json();
    const woId = list.workOrders[0].id as string;
    const bikeId = list.workOrders[0].bikeId as string;
    for (const [name, path] of [
      ["work-orders", "/office"],
      ["work-order", `/office/work-orders/${woId}`],
      ["intake", "/office/work-orders/new"],
      ["customers", "/office/customers"],
      ["bike", `/office/bikes/${bikeId}`],
      ["templates", "/office/templates"],
      ["template-edit", "/office/templates/edit?key=turbo-kit-intercooler"],
      ["parts", "/office/parts"],
    ] as const) {
      await page.goto(path);
      await expect(page.getByRole("heading", { level: 1 })).toBeVisible();
      await page.waitForLoadState("networkidle");
      await noSideScroll(page);
      await page.screenshot({ path: `test-results/office-screens/${name}-${size.width}x${size.height}.png`, fullPage: true });
    }
  });
}

test("the customer's own page shows the quote to approve, at both tablet sizes", async ({ page }) => {
  await signIn(page, "customer");
  const card = page.getByTestId("my-work-order").filter({ hasText: "#1003" });
  // work order 1003's demo quote: £385.00 + £210.00 + 4.5 h × £68.00 = £901.00; VAT 20 % = £180.20; total £1,081.20
  await expect(card.getByTestId("customer-quote-total")).toHaveText("£1,081.20");
  await expect(card.getByRole("button", { name: "Approve this quote" })).toBeVisible();
  for (const size of [
    { width: 1024, height: 768 },
    { width: 768, height: 1024 },
  ]) {
    await page.setViewportSize(size);
    await noSideScroll(page);
    await page.screenshot({ path: `test-results/office-screens/my-bikes-${size.width}x${size.height}.png`, fullPage: true });
  }
});

test("the customer sees how far the build has got, in the same figures the office sees", async ({ browser }) => {
  const office = await (await browser.newContext()).newPage();
  await signIn(office, "office");
  // the demo's oldest job: opened by its address (the list, newest first, may page it off the first screen)
  const [job] = await query<{ id: string }>("SELECT id FROM work_orders WHERE number = 1001");
  await office.goto(`/office/work-orders/${job.id}`);
  const summary = office.getByTestId("build-progress").getByTestId("progress-summary");
  await expect(summary).toContainText("steps done");
  const [, done, total, approved, stages] = /^(\d+) of (\d+) steps done · (\d+) of (\d+) stages approved/.exec(
    (await summary.textContent())!,
  )!;
  expect(Number(done)).toBeGreaterThan(0); // the demo turbo build has its bottom end done

  const customer = await (await browser.newContext()).newPage();
  await signIn(customer, "customer"); // Felix Amadi owns the bike of job #1001
  const card = customer.getByTestId("my-work-order").filter({ hasText: "#1001" });
  await expect(card.getByTestId("my-build-progress")).toHaveText(
    `Build: ${done} of ${total} steps done · ${approved} of ${stages} stages checked by the workshop supervisor`,
  );
  // a job not on the bench shows no build line
  await expect(customer.getByTestId("my-work-order").filter({ hasText: "#1003" }).getByTestId("my-build-progress")).toHaveCount(0);
});
