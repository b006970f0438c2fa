import { createHash } from "node:crypto";
import { expect, test, type Page } from "@playwright/test";
import { DEMO_PASSWORD } from "@/db/seed/demo-people";
import { query } from "./support/e2e-db";
import { expectMail, MAIL_WEB, paymentEvents, webhookDeliveries } from "./support/fakes";
import { signIn } from "./support/demo-users";

// Extra work and the final bill on demo job 1073 (in build, approved quote: 3.50 h × £68.00 and a
// bearing set at £145.00, deposit £100.00 paid; an oil filter fitted that no line names). The office
// writes two lines of extra work; the customer, signed in, declines one and approves the other;
// the office issues the bill (the declined line shown and not billed, the oil filter added); the
// customer pays the balance through the fake payment service and its signed webhook, and gets a receipt.

const WREN = { email: "wren.ashby@example.test", name: "Wren Ashby" };

/** Every e-mail to Wren with this subject, oldest first (maildev outlives one run). */
async function mailsToWren(subject: string): Promise<Array<{ subject: string; text?: string; to: Array<{ address: string }> }>> {
  const all = (await (await fetch(`${MAIL_WEB}/api/email`)).json()) as Array<{
    subject: string;
    text?: string;
    to: Array<{ address: string }>;
  }>;
  return all.filter((m) => m.subject === subject && m.to.some((t) => t.address === WREN.email));
}

async function signInAsWren(page: Page) {
  await page.goto("/signin");
  await page.getByLabel("E-mail").fill(WREN.email);
  await page.getByLabel("Password").fill(DEMO_PASSWORD);
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByTestId("whoami")).toContainText(WREN.name);
}

test("extra work round trip: written, one line declined and one approved, billed, balance paid", async ({ browser }) => {
  test.setTimeout(240_000); // three people's pages, a payment and two e-mails
  const [{ id }] = await query<{ id: string }>("SELECT id FROM work_orders WHERE number = 1073");
  const office = await (await browser.newContext({ viewport: { width: 1024, height: 768 } })).newPage();
  await signIn(office, "office");
  await office.goto(`/office/work-orders/${id}`);

  // the office writes two lines of extra work
  const form = office.getByTestId("extra-work-form");
  await form
    .getByLabel("Finding (what was found, and why it needs the work)")
    .fill("Cam chain guide cracked at the top mount; the chain has worn a groove in it.");
  const first = form.getByTestId("extra-work-line").nth(0);
  await first.getByLabel("Description").fill("Cam chain guide");
  await first.getByLabel("Part number").fill("GS-CCG");
  await first.getByLabel("Quantity", { exact: true }).fill("1");
  await first.getByLabel("Unit price (GBP)").fill("42.50");
  await form.getByRole("button", { name: "Add a line" }).click();
  const second = form.getByTestId("extra-work-line").nth(1);
  await second.getByLabel("Kind").selectOption("labour");
  await second.getByLabel("Description").fill("Fit the cam chain guide");
  await second.getByLabel("Hours", { exact: true }).fill("1.5");
  await second.getByLabel("Unit price (GBP)").fill("68");
  // a price with three decimals is refused with the field named, and nothing is written
  await second.getByLabel("Unit price (GBP)").fill("68.001");
  await form.getByRole("button", { name: "Send the extra work to the customer" }).click();
  await expect(office.getByTestId("form-error")).toContainText("Line 2: quantity and unit price are numbers with at most two decimals");
  await expect(office.getByTestId("supplement")).toHaveCount(0);
  await second.getByLabel("Unit price (GBP)").fill("68");
  await form.getByRole("button", { name: "Send the extra work to the customer" }).click();
  const sup = office.getByTestId("supplement");
  await expect(sup).toHaveCount(1);
  await expect(sup.getByTestId("supplement-line")).toHaveCount(2);
  await expect(sup.getByTestId("answer-badge")).toHaveText(["… Waiting for the customer", "… Waiting for the customer"]);
  await expectMail(WREN.email, "Extra work found on your Pelham Scarp 800 (work order 1073)");
  // maildev keeps earlier runs' e-mails: this run's link is the one whose token's hash is on file
  const onFile = new Set((await query<{ token_sha256: string }>("SELECT token_sha256 FROM supplement_links")).map((r) => r.token_sha256));
  const link = (await mailsToWren("Extra work found on your Pelham Scarp 800 (work order 1073)"))
    .map((m) => /\/extra-work\/([A-Za-z0-9_-]{43})/.exec(m.text ?? ""))
    .find((m) => m && onFile.has(createHash("sha256").update(m[1]).digest("hex")))?.[0];
  expect(link).toBeTruthy();
  // the outbox never held a working link: the queue worker made it as it sent the e-mail
  const outbox = await query<{ body: string }>(
    "SELECT o.body FROM mail_outbox o JOIN work_orders w ON w.id = o.work_order_id WHERE o.kind = 'extra_work' AND w.number = 1073",
  );
  expect(outbox.length).toBeGreaterThan(0);
  for (const o of outbox)
    expect([o.body.includes("[[extra-work-link]]"), /\/extra-work\/[A-Za-z0-9_-]{43}/.test(o.body)]).toEqual([true, false]);

  // the customer, signed in, declines the part and approves the labour
  const customer = await (await browser.newContext({ viewport: { width: 768, height: 1024 } })).newPage();
  await signInAsWren(customer);
  const card = customer.getByTestId("my-work-order").filter({ hasText: "#1073" });
  const answers = card.getByTestId("customer-extra-work");
  await answers.getByRole("button", { name: "Send my answers" }).click();
  await expect(answers.getByRole("alert")).toContainText("Approve or decline every line");
  const partLine = answers.getByTestId("answer-line").filter({ hasText: /^Cam chain guide —/ });
  await partLine.getByLabel("✖ Decline").check();
  await partLine.getByLabel("Comment (optional)").fill("I have a new guide at home; fit mine please");
  await answers.getByTestId("answer-line").filter({ hasText: "Fit the cam chain guide" }).getByLabel("✔ Approve").check();
  await answers.getByRole("button", { name: "Send my answers" }).click();
  await expect(answers.getByTestId("answer-badge")).toHaveText(["✖ Declined — not billed", "✔ Approved"]);
  await expect(answers).toContainText("“I have a new guide at home; fit mine please”");
  // the job's total: the approved quote (238.00 + 145.00) and the approved labour (102.00), tax 20 %
  await expect(card.getByTestId("agreed-total-figure")).toHaveText("£582.00");
  await answers.screenshot({ path: test.info().outputPath("customer-answers-768.png") });

  // the e-mailed link, opened afterwards without signing in, shows the answers and asks nothing
  const anon = await (await browser.newContext()).newPage();
  await anon.goto(link!);
  await expect(anon.getByTestId("answer-badge")).toHaveText(["✖ Declined — not billed", "✔ Approved"]);
  await expect(anon.getByRole("button", { name: "Send my answers" })).toHaveCount(0);

  // the office sees both answers, adds the fitted oil filter and issues the bill
  await office.reload();
  await expect(office.getByTestId("supplement").getByTestId("answer-badge")).toHaveText(["✖ Declined — not billed", "✔ Approved"]);
  const bill = office.getByTestId("bill-panel");
  await expect(bill.getByTestId("labour-choice")).toHaveCount(2);
  await bill.getByLabel(/Add 1 × Oil filter/).check();
  await bill.getByLabel("Unit price (GBP)").fill("9.50");
  // 238.00 + 145.00 + 102.00 + 9.50 = 494.50; tax 98.90; total 593.40
  await expect(bill.getByTestId("bill-total")).toHaveText("£593.40");
  await bill.getByRole("button", { name: "Issue the bill (£593.40)" }).click();
  await expect(bill).toContainText(/Bill \d+ — issued/);
  const declined = bill.getByTestId("bill-line").filter({ hasText: /^Cam chain guide/ });
  await expect(declined.getByTestId("answer-badge")).toHaveText("✖ Declined — not billed");
  await expect(declined).toContainText("not billed");
  await expect(bill.getByTestId("bill-line").filter({ hasText: "Fit the cam chain guide" }).getByTestId("labour-basis")).toContainText(
    "Billed as quoted · quoted 1.50 h · clocked 0.00 h",
  );
  await expect(bill.getByTestId("bill-balance")).toHaveText("£493.40");
  await bill.screenshot({ path: test.info().outputPath("office-bill-1024.png") });

  // the customer pays the balance; the fake's signed webhook marks it paid; a receipt is e-mailed
  const receiptsBefore = (await mailsToWren("Receipt: bill for work order 1073 paid")).length;
  await customer.reload();
  const cbill = customer.getByTestId("customer-bill");
  await expect(
    cbill
      .getByTestId("bill-line")
      .filter({ hasText: /^Cam chain guide/ })
      .getByTestId("answer-badge"),
  ).toHaveText("✖ Declined — not billed");
  await cbill.getByRole("button", { name: "Pay the balance (£493.40)" }).click();
  await expect(cbill.getByTestId("balance-status")).toHaveText("✔ Balance paid. Thank you — a receipt is on its way by e-mail.", {
    timeout: 15_000,
  });
  await cbill.screenshot({ path: test.info().outputPath("customer-bill-768.png") });
  // the whole bill shows at 768 px: nothing of it runs past its card or the page
  expect(await cbill.evaluate((el) => [...el.querySelectorAll("*")].filter((c) => c.scrollWidth > c.clientWidth + 1).length)).toBe(0);
  expect(await customer.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)).toBeLessThanOrEqual(0);
  const paid = (await paymentEvents()).find((e) => e.type === "payment_intent.succeeded" && e.data.object.amount === 49340);
  expect(paid?.data.object.metadata.invoice_id).toBeTruthy();
  await expect
    .poll(async () => (await webhookDeliveries()).find((d) => d.eventId === paid!.id && d.url.endsWith("/api/payments/webhook"))?.status, {
      timeout: 10_000,
    })
    .toBe(200);
  await expect
    .poll(async () => (await mailsToWren("Receipt: bill for work order 1073 paid")).length, { timeout: 15_000 })
    .toBe(receiptsBefore + 1);
  expect((await mailsToWren("Receipt: bill for work order 1073 paid")).at(-1)!.text).toContain("£493.40");
  const rows = await query<{ status: string; amount_minor: string }>(
    "SELECT p.status, p.amount_minor FROM balance_payments p JOIN work_orders w ON w.id = p.work_order_id WHERE w.number = 1073",
  );
  expect(rows).toEqual([{ status: "paid", amount_minor: "49340" }]);
});
