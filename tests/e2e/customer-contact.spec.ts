import { expect, test, type Page } from "@playwright/test";
import { DEMO_INVITEE } from "@/db/seed/demo-customer-contact";
import { signIn } from "./support/demo-users";
import { query } from "./support/e2e-db";
import { expectMail, MAIL_WEB, TINY_PNG } from "./support/fakes";
import { goByHeader } from "./support/nav";

// The customer's side of a job, end to end with the queue worker in the app and maildev:
// the office makes Hollis Penhale (demo customer, job 1076) a sign-in without a password, the
// invitation e-mail's link sets the password once, Hollis signs in and sees the bike, asks a
// question, the office finds it among the unanswered and answers, then shares a teardown photo
// as a progress update that reaches Hollis's page and inbox — and nobody else.

const PASSWORD = "skerry-twin-850";

/** maildev outlives the e2e database: earlier runs' e-mails about Hollis and job 1076 are removed first, so only this run's count. */
async function forgetEarlierMail() {
  const all = (await (await fetch(`${MAIL_WEB}/api/email`)).json()) as Array<{
    id: string;
    subject: string;
    to: Array<{ address: string }>;
  }>;
  const earlier = all.filter(
    (m) => m.to.some((t) => t.address === DEMO_INVITEE.email) || m.subject.includes(`work order ${DEMO_INVITEE.number}`),
  );
  for (const m of earlier) expect((await fetch(`${MAIL_WEB}/api/email/${m.id}`, { method: "DELETE" })).status).toBe(200);
}

async function fitsTheTablet(page: Page, name: string) {
  for (const size of [
    { width: 1024, height: 768 },
    { width: 768, height: 1024 },
  ]) {
    await page.setViewportSize(size);
    expect(await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)).toBeLessThanOrEqual(0);
    await page.screenshot({ path: `test-results/customer-contact/${name}-${size.width}x${size.height}.png`, fullPage: true });
  }
  await page.setViewportSize({ width: 1024, height: 768 });
}

test("invitation link from the e-mail, a question answered, and a progress update with a photo reaching the customer", async ({
  browser,
}) => {
  test.setTimeout(240_000);
  await forgetEarlierMail();
  const office = await (await browser.newContext()).newPage();
  await signIn(office, "office");
  await goByHeader(office, "Sign-ins");

  // 1. a customer's sign-in without a password: the invitation e-mail goes instead
  await office.getByLabel("Name").fill(DEMO_INVITEE.name);
  await office.getByLabel("E-mail").fill(DEMO_INVITEE.email);
  await office.getByLabel("Role").selectOption("customer");
  await office.getByLabel("Customer").selectOption({ label: DEMO_INVITEE.name });
  await office.getByRole("button", { name: "Make the sign-in" }).click();
  await expect(office.getByTestId("form-ok")).toContainText(`Sign-in made for ${DEMO_INVITEE.email}; the invitation e-mail is on its way.`);

  const invitation = await expectMail(DEMO_INVITEE.email, "Set your password for Gannet Street Engine Works");
  const link = /https?:\/\/[^\s]+\/welcome\/([A-Za-z0-9_-]{43})/.exec(invitation.text ?? "");
  expect(link, invitation.text).not.toBeNull();
  const row = office.getByTestId("user-row").filter({ hasText: DEMO_INVITEE.email });
  await expect
    .poll(async () => {
      await office.reload();
      return row.getByTestId("invitation-state").textContent();
    })
    .toMatch(/^◷ Invited; the link works until /);

  // 2. the link: a mismatch is said beside the field; then the password is set, once
  const hollis = await (await browser.newContext()).newPage();
  await hollis.goto(`/welcome/${link![1]}`);
  await expect(hollis.getByText(`For the sign-in ${DEMO_INVITEE.email}`)).toBeVisible();
  await fitsTheTablet(hollis, "welcome");
  await hollis.getByLabel("Password", { exact: true }).fill(PASSWORD);
  await hollis.getByLabel("Password again").fill("something-else-1");
  await hollis.getByRole("button", { name: "Set my password" }).click();
  await expect(hollis.getByTestId("error-repeat")).toContainText("the two passwords differ");
  await hollis.getByLabel("Password again").fill(PASSWORD);
  await hollis.getByRole("button", { name: "Set my password" }).click();
  await expect(hollis.getByTestId("password-set")).toContainText("Your password is set. This link cannot be used again.");
  await hollis.reload();
  await expect(hollis.getByTestId("link-refused")).toContainText("already been used to set a password. Nothing was changed.");
  await expect
    .poll(async () => {
      await office.reload();
      return row.getByTestId("invitation-state").textContent();
    })
    .toMatch(/^✔ Password set /);

  // 3. sign in with it and see the bike
  await expect(hollis.getByTestId("set-password-form")).toHaveCount(0);
  await hollis.goto("/signin");
  await hollis.getByLabel("E-mail").fill(DEMO_INVITEE.email);
  await hollis.getByLabel("Password").fill(PASSWORD);
  await hollis.getByRole("button", { name: "Sign in" }).click();
  await expect(hollis).toHaveURL(/\/my-bikes$/);
  const job = hollis.getByTestId("my-work-order").filter({ hasText: `#${DEMO_INVITEE.number}` });
  await expect(hollis.getByTestId("my-bike")).toContainText(`Tag ${DEMO_INVITEE.tag}`);

  // 4. Hollis asks; the office sees it unanswered, answers, and Hollis gets the answer by e-mail
  const question = "Is the ticking the cam chain or the valve clearances?";
  await job.getByLabel("Ask the workshop").fill(question);
  await job.getByRole("button", { name: "Send", exact: true }).click();
  await expect(job.getByTestId("thread-message")).toContainText([question]);
  await expectMail("maren@gannet-street.test", `${DEMO_INVITEE.name} asks about work order ${DEMO_INVITEE.number}`);
  await goByHeader(office, "Work orders");
  const waiting = office.getByTestId("unanswered-thread").filter({ hasText: `Job #${DEMO_INVITEE.number}` });
  await expect(waiting).toContainText(question);
  await waiting.getByRole("link", { name: `Job #${DEMO_INVITEE.number}` }).click();
  await expect(office.getByTestId("thread-waiting")).toContainText("The customer is waiting for an answer.");
  const answer = "Valve clearances: two exhaust shims were tight. We are correcting them.";
  await office.getByLabel("Answer the customer").fill(answer);
  await office.getByRole("button", { name: "Send the answer" }).click();
  await expect(office.getByTestId("office-thread").getByTestId("thread-message")).toContainText([question, answer]);
  await expect(office.getByTestId("thread-waiting")).toHaveCount(0);
  const reply = await expectMail(DEMO_INVITEE.email, /^Reply about your Skerry Twin 850 Scrambler/);
  expect(reply.text).toContain(answer);

  // 5. a teardown photo on the job, shared as a progress update
  await office.getByLabel("What was found").fill("Exhaust shims on cylinder 2 worn; clearance 0.12 mm against 0.20–0.25 mm.");
  await office.getByLabel("Photos", { exact: true }).setInputFiles({ name: "shims.png", mimeType: "image/png", buffer: TINY_PNG });
  await office.getByRole("button", { name: "Save finding" }).click();
  const tile = office.getByTestId("pick-photo").first();
  await expect
    .poll(async () => {
      await office.reload();
      return office.getByTestId("pick-photo").count();
    })
    .toBe(1);
  const note = "Head off: exhaust shims replaced, clearances now in spec. Cam timing checked next.";
  await office.getByLabel("Note to the customer").fill(note);
  await tile.getByRole("checkbox").check();
  await expect(tile).toContainText("✔ Shared");
  await fitsTheTablet(office, "office-customer-panel");
  await office.getByRole("button", { name: "Share with the customer" }).click();
  await expect(office.getByTestId("office-progress-updates").getByTestId("form-ok")).toContainText(
    "Shared on the customer's page and e-mailed to them.",
  );
  await expect(office.getByTestId("shared-update")).toContainText(note);

  // on Hollis's page, with the photo's bytes
  await hollis.reload();
  const update = job.getByTestId("my-progress-update");
  await expect(update).toContainText(note);
  const img = update.getByTestId("my-progress-photo");
  await expect(img).toHaveJSProperty("complete", true);
  expect(await img.evaluate((i: HTMLImageElement) => i.naturalWidth)).toBe(8);
  await fitsTheTablet(hollis, "my-bikes");
  const src = (await img.getAttribute("src"))!;
  const own = await hollis.request.get(src);
  expect(own.status()).toBe(200);
  expect(Buffer.from(await own.body())).toEqual(TINY_PNG);
  // in Hollis's inbox
  const news = await expectMail(DEMO_INVITEE.email, /^News on your Skerry Twin 850 Scrambler \(work order 1076\)/);
  expect(news.text).toContain(note);
  expect(news.text).toContain("A photo is on your bike's page");

  // another customer gets nothing: the same photo is "not found" for them
  const felix = await (await browser.newContext()).newPage();
  await signIn(felix, "customer");
  const theirs = await felix.request.get(src);
  expect(theirs.status()).toBe(404);
  expect(await theirs.json()).toEqual({ error: "No such photo.", issues: [] });
  // and the record holds it for good
  const [stored] = await query<{ n: number }>(
    `SELECT count(*)::int AS n FROM progress_updates p JOIN work_orders w ON w.id = p.work_order_id WHERE w.number = $1 AND p.note = $2`,
    [DEMO_INVITEE.number, note],
  );
  expect(stored.n).toBe(1);
});
