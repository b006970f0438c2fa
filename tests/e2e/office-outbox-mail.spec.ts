import { expect, test } from "@playwright/test";
import { demoUser, signIn } from "./support/demo-users";
import { query } from "./support/e2e-db";
import { expectMail } from "./support/fakes";
import { goByHeader } from "./support/nav";

// The office's E-mail outbox: an e-mail that failed every try is listed with its error, in colour,
// words and shape; "Try again" hands it to the queue worker running in the app, and it arrives.
test("a failed e-mail is listed on the outbox page and goes out once the office tries it again", async ({ page }) => {
  const to = `outbox-${Date.now()}@gannet-street.test`;
  const subject = `Outbox check ${Date.now()}`;
  // A send that failed for good (no screen makes SMTP fail on purpose): set up in the database.
  await query(
    `INSERT INTO mail_outbox (shop_id, kind, cause, recipient, subject, body, state, attempts, last_error)
     SELECT shop_id, 'quote_ready', $1, $2, $3, 'Hello from the outbox test.', 'failed', 6, 'connect ECONNREFUSED 127.0.0.1:9' FROM users WHERE email = $4`,
    [`e2e:${to}`, to, subject, demoUser("office").email],
  );
  await signIn(page, "office");
  await goByHeader(page, "E-mail outbox");
  await expect(page.getByRole("heading", { name: "E-mail outbox" })).toBeVisible();
  const row = page.getByTestId("mail-open").getByTestId("mail-row").filter({ hasText: subject });
  await expect(row).toContainText("✖ Failed — not sent");
  await expect(row).toContainText("connect ECONNREFUSED 127.0.0.1:9");
  for (const size of [
    { width: 1024, height: 768 },
    { width: 768, height: 1024 },
  ]) {
    await page.setViewportSize(size);
    // The page fits the tablet: no sideways scrolling.
    expect(await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)).toBeLessThanOrEqual(0);
    await page.screenshot({ path: `test-results/office-screens/outbox-mail-${size.width}x${size.height}.png`, fullPage: true });
  }

  await row.getByRole("button", { name: `Try again: ${subject} to ${to}` }).click();
  const mail = await expectMail(to, subject);
  expect(mail.text).toContain("Hello from the outbox test.");
  await expect
    .poll(async () => {
      await page.reload();
      return page.getByTestId("mail-sent").getByTestId("mail-row").filter({ hasText: subject }).count();
    })
    .toBe(1);
  await expect(page.getByTestId("mail-sent").getByTestId("mail-row").filter({ hasText: subject })).toContainText("✔ Sent");
  const [r] = await query<{ state: string; attempts: number }>("SELECT state, attempts FROM mail_outbox WHERE recipient = $1", [to]);
  expect(r).toEqual({ state: "sent", attempts: 7 });
});
