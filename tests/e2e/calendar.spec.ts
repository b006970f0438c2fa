import { expect, test, type Page } from "@playwright/test";
import { signIn } from "./support/demo-users";
import { query } from "./support/e2e-db";

// The week plan: the office books demo job #1050 (the Kestrel on the dyno) on the dyno next week,
// a second job on an overlapping time is refused naming #1050, and the job's dyno page shows the
// booking with a link back to the week plan.

const SIZES = [
  { width: 1024, height: 768 },
  { width: 768, height: 1024 },
];

async function checkSizes(page: Page, name: string) {
  for (const size of SIZES) {
    await page.setViewportSize(size);
    expect(await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)).toBeLessThanOrEqual(0);
    await page.screenshot({ path: `test-results/calendar-screens/${name}-${size.width}x${size.height}.png`, fullPage: true });
  }
  await page.setViewportSize(SIZES[0]);
}

async function chooseJob(page: Page, prefix: string) {
  const value = await page.locator("select[name=workOrderId] option", { hasText: prefix }).first().getAttribute("value");
  await page.locator("select[name=workOrderId]").selectOption(value!);
}

test("book a job on the dyno in the week plan; a clash names it; the job's dyno page shows the booking", async ({ page }) => {
  await signIn(page, "office");
  await page.goto("/office/calendar");
  await expect(page.getByTestId("week-title")).toContainText("Dyno: week of");
  await page.getByRole("link", { name: "Week after →" }).click();
  await expect(page).toHaveURL(/week=\d{4}-\d{2}-\d{2}/);
  const form = page.getByTestId("book-form");
  await chooseJob(page, "#1050 ·");
  const dayLabel = (await form.locator("select[name=day] option").first().textContent())!;
  await form.locator("input[name=from]").fill("09:00");
  await form.locator("input[name=to]").fill("11:00");
  await form.getByRole("button", { name: "Book this slot" }).click();
  const booking = page.getByTestId("booking").filter({ hasText: "Job #1050" });
  await expect(booking).toContainText("09:00–11:00");
  await expect(booking).toContainText("booked by");

  // Another job over the same time: refused, naming the booking there.
  const jobAtFirst = await booking.getByRole("link", { name: "Job #1050" }).getAttribute("href");
  const values = await page.locator("select[name=workOrderId] option").evaluateAll((os) => os.map((o) => (o as HTMLOptionElement).value));
  const other = values.find((v) => v && !jobAtFirst!.endsWith(v));
  await page.locator("select[name=workOrderId]").selectOption(other!);
  await form.locator("input[name=from]").fill("10:00");
  await form.locator("input[name=to]").fill("12:00");
  await form.getByRole("button", { name: "Book this slot" }).click();
  const shortDay = dayLabel.replace(/^\w+ /, "").replace(/ \d{4}$/, "");
  await expect(page.getByTestId("book-error")).toHaveText(`✖ The dyno is booked for job #1050, 09:00–11:00 on ${shortDay}.`);
  await expect(page.getByTestId("booking")).toHaveCount(1);
  await checkSizes(page, "week-plan");

  // The job's dyno page shows it and links back to the week plan.
  const workOrderId = jobAtFirst!.split("/").pop()!;
  await page.goto(`/jobs/${workOrderId}/dyno`);
  const panel = page.getByTestId("dyno-bookings");
  await expect(panel).toContainText(`09:00–11:00 on Dyno`);
  await checkSizes(page, "dyno-page");
  await panel.getByRole("link").first().click();
  await expect(page.getByTestId("week-title")).toContainText("Dyno: week of");
  await expect(page.getByTestId("booking").filter({ hasText: "Job #1050" })).toContainText("09:00–11:00");
});

test("the office adds a resource, sees it in the week plan, retires it with a reason; opening hours refuse a closing before the opening", async ({
  page,
}) => {
  const name = `Bay ${Date.now() % 100000}`;
  await signIn(page, "office");
  await page.goto("/office/calendar");
  await page.getByRole("link", { name: "Resources and opening hours" }).click();
  await expect(page.getByRole("heading", { name: "Resources and opening hours" })).toBeVisible();

  // opening hours: a closing before the opening is refused in words, and nothing changes
  const hours = page.getByTestId("hours-form");
  const opensBefore = await hours.locator("input[name=opensAt]").inputValue();
  const closesBefore = await hours.locator("input[name=closesAt]").inputValue();
  await hours.locator("input[name=closesAt]").fill("07:00");
  await hours.getByRole("button", { name: "Save opening hours" }).click();
  await expect(page.getByTestId("hours-error")).toContainText("Closes at must be after opens at.");
  await page.reload();
  await expect(page.getByTestId("hours-form").locator("input[name=closesAt]")).toHaveValue(closesBefore);
  await expect(page.getByTestId("hours-form").locator("input[name=opensAt]")).toHaveValue(opensBefore);

  // a new bay: refused without a name, then added and bookable in the week plan
  const add = page.getByTestId("add-resource-form");
  await add.getByRole("button", { name: "Add resource" }).click();
  await expect(page.getByTestId("add-resource-error")).toHaveText("✖ Enter the name.");
  await add.locator("input[name=name]").fill(name);
  await add.getByRole("button", { name: "Add resource" }).click();
  await expect(page.getByTestId("add-resource-ok")).toHaveText(`✔ ${name} added: it can be booked now.`);
  const row = page.getByTestId("resource-row").filter({ hasText: name });
  await expect(row).toContainText("● In use");
  await checkSizes(page, "resources");
  await page.goto("/office/calendar");
  await page
    .getByRole("navigation", { name: "Resources" })
    .getByRole("link", { name: new RegExp(name) })
    .click();
  await expect(page.getByTestId("week-title")).toContainText(`${name}: week of`);

  // retired with the reason: marked, and no longer offered a booking form
  await page.goto("/office/calendar/resources");
  await row.getByRole("button", { name: `Retire ${name}…` }).click();
  await row.getByRole("button", { name: "Retire it" }).click();
  await expect(row.getByTestId("retire-error")).toContainText("say why");
  await row.locator("input[name=reason]").fill("Wall knocked through for the new dyno cell");
  await row.getByRole("button", { name: "Retire it" }).click();
  await expect(page.getByTestId("resource-row").filter({ hasText: name })).toContainText("⊘ Retired");
  await expect(page.getByTestId("resource-row").filter({ hasText: name })).toContainText("Wall knocked through for the new dyno cell");
  await page.goto("/office/calendar");
  await page
    .getByRole("navigation", { name: "Resources" })
    .getByRole("link", { name: new RegExp(name) })
    .click();
  await expect(page.getByText("⊘ Retired: Wall knocked through for the new dyno cell. It can no longer be booked.")).toBeVisible();
  await expect(page.getByTestId("book-form")).toHaveCount(0);
});

test("the office promises a job back on a day (not one gone by), and a job past its promised day is listed first as late", async ({
  page,
}) => {
  const [job] = await query<{ id: string; shop_id: string }>("SELECT id, shop_id FROM work_orders WHERE number = 1060");
  const [late] = await query<{ id: string }>("SELECT id FROM work_orders WHERE number = 1061");
  await signIn(page, "office");
  await page.goto(`/office/work-orders/${job.id}`);
  const panel = page.getByTestId("promise-panel");
  const day = (offset: number) => {
    const d = new Date(Date.now() + offset * 86_400_000);
    return d.toISOString().slice(0, 10);
  };
  // a day gone by is refused with the reason; nothing is promised
  const before = await panel.getByTestId("promised-date").textContent();
  await panel.locator("input[name=promisedOn]").fill(day(-3));
  await panel.getByRole("button", { name: "Set promised date" }).click();
  await expect(panel.getByText(/✖ .*past/i)).toBeVisible();
  await expect(panel.getByTestId("promised-date")).toHaveText(before!);
  // a day to come is kept with who set it
  await panel.locator("input[name=promisedOn]").fill(day(10));
  await panel.getByRole("button", { name: "Set promised date" }).click();
  await expect(panel.getByTestId("promised-date")).toContainText("Promised for");
  await expect(panel.getByTestId("promised-date")).toContainText("set by");

  // time passes for job 1061: a promise made earlier for a day now gone (written as that earlier request left it)
  const [office] = await query<{ id: string }>("SELECT id FROM users WHERE shop_id = $1 AND role = 'office' ORDER BY name LIMIT 1", [
    job.shop_id,
  ]);
  await query(
    "INSERT INTO work_order_promises (shop_id, work_order_id, promised_on, set_by, set_at) VALUES ($1, $2, $3, $4, now() - interval '9 days')",
    [job.shop_id, late.id, day(-2), office.id],
  );
  await page.goto("/office");
  const lateList = page.getByTestId("late-jobs");
  await expect(lateList).toBeVisible();
  await expect(lateList.getByTestId("late-job").filter({ hasText: "Job #1061" })).toContainText(/2 days late/);
  await expect(lateList.getByTestId("late-job").filter({ hasText: "Job #1060" })).toHaveCount(0);
  await checkSizes(page, "late-jobs");
});
