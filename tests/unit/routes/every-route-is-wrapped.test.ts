import { readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import type { RouteHandler } from "@/app/_server/route";
import { NOT_FROM_OUR_PAGES } from "@/app/_server/same-origin";
import type { Db } from "@/db/setup/client";
import { ROLES, type Role } from "@/lib/auth/roles";
import type { SessionUser } from "@/lib/auth/session-user";
import { ROOT as root, rolesAllowed, routeFiles } from "../../support/route-handlers";

// Every route handler (every GET/POST/PUT/PATCH/DELETE exported by app/api/**/route.ts) is built by
// the one route wrapper (app/_server/route.ts): it is imported here and called. Each must
//   - answer 401 to nobody and 403 to a role outside its area, with the one error body — or be one
//     of the public routes, which name the check they make instead;
//   - for a state-changing method: refuse a request without our Origin (403, before anything else),
//     and refuse a text/plain body (415) even from a role that may use it.
// None of these calls reaches the database: the wrapper refuses before the handler runs.

const METHODS = ["GET", "POST", "PUT", "PATCH", "DELETE"] as const;
const MUTATING = new Set(["POST", "PUT", "PATCH", "DELETE"]);
const ORIGIN = "http://benchtag.test";

/** The public routes and the check each makes instead of a session, looked for in its code. */
const PUBLIC: Record<string, { check: string; mustContain: Array<{ file: string; text: string }> }> = {
  "app/api/auth/[...nextauth]/route.ts": {
    check: "next-auth",
    mustContain: [{ file: "app/api/auth/[...nextauth]/route.ts", text: "NextAuth(authOptions)" }],
  },
  "app/api/bench/outbox-handover/route.ts": {
    check: "ended-session",
    mustContain: [
      { file: "app/api/bench/outbox-handover/route.ts", text: "sessionEndedByOthers(db, claim.sessionId)" },
      {
        file: "db/auth/sessions.ts",
        text: `.where("ended_reason", "in", ["ended-by-office", "tablet-ended-by-office", "user-turned-off"])`,
      },
    ],
  },
  "app/api/welcome/route.ts": {
    check: "invitation-link",
    mustContain: [
      { file: "app/api/welcome/route.ts", text: "setPasswordFromLink(db, { token: body.token" },
      { file: "db/customer-contact/invitations.ts", text: '.where("l.token_sha256", "=", hashOf(token))' },
    ],
  },
  "app/api/extra-work/answers/route.ts": {
    check: "answer-link",
    mustContain: [
      { file: "app/api/extra-work/answers/route.ts", text: "answerByLink(db, body.token" },
      { file: "db/office/supplements.ts", text: "const refused = linkRefusal(state, signedInCustomerId);" },
    ],
  },
  "app/api/payments/webhook/route.ts": {
    check: "payment-signature",
    mustContain: [{ file: "app/_server/payment-webhook.ts", text: "verifyPaymentWebhook(rawBody, signature" }],
  },
};

/** The routes whose JSON texts are taken as sent: each item is checked, and made storable, on its own. */
const TEXTS_TAKEN_AS_SENT = ["app/api/sync/route.ts", "app/api/sync/discards/route.ts", "app/api/bench/outbox-handover/route.ts"];

const noDb = {} as Db; // never used: every call below is refused before a query
const userWith = (role: Role): SessionUser => ({
  id: "00000000-0000-4000-8000-000000000001",
  shopId: "00000000-0000-4000-8000-000000000002",
  role,
  name: "Test",
  email: "t@example.test",
  customerId: null,
});

const files = routeFiles();

describe("every route handler goes through the route wrapper", () => {
  it("finds the route handlers", () => {
    expect(files.length).toBeGreaterThan(30);
  });

  for (const file of files) {
    describe(file, () => {
      it("exports only wrapped handlers, one for each method in its code", async () => {
        const mod = (await import(path.join(root, file))) as Record<string, unknown>;
        const code = readFileSync(path.join(root, file), "utf8");
        const named = METHODS.filter((m) =>
          new RegExp(`export\\s+(?:const|let|async\\s+function|function)\\s+${m}\\b|\\bas\\s+${m}\\b`).test(code),
        );
        const exported = METHODS.filter((m) => m in mod);
        expect(exported.length, "exports at least one handler").toBeGreaterThan(0);
        expect(exported).toEqual(named);
        for (const m of exported) {
          const h = mod[m] as RouteHandler<unknown>;
          expect(typeof h.handle, `${m} is built by route() or publicRoute()`).toBe("function");
          expect(h.rule, `${m} carries its rule`).toBeDefined();
          if (h.rule.check) {
            expect(PUBLIC[file]?.check, `${m} is public only as a listed exception`).toBe(h.rule.check);
            for (const need of PUBLIC[file].mustContain) expect(readFileSync(path.join(root, need.file), "utf8")).toContain(need.text);
          } else {
            expect(h.rule.access, `${m} names who may use it`).toBeDefined();
          }
        }
        // the first import of a route loads its whole module graph (PDF, object storage): slow on a busy machine
      }, 30_000);

      it("answers 401 to nobody and 403 to a role outside its area, with the one error body", async () => {
        const mod = (await import(path.join(root, file))) as Record<string, RouteHandler<unknown>>;
        for (const m of METHODS.filter((x) => x in mod)) {
          const h = mod[m];
          if (h.rule.check) continue;
          const req = () => new Request(`${ORIGIN}/x`, { method: m, headers: { origin: ORIGIN } });
          const nobody = await h.handle(req(), { user: null, db: noDb, params: { id: "x" } });
          expect([m, nobody.status, await nobody.json()]).toEqual([m, 401, { error: "Sign in first.", issues: [] }]);
          const outsider = ROLES.find((r) => !rolesAllowed(h).includes(r));
          if (!outsider) continue;
          const refused = await h.handle(req(), { user: userWith(outsider), db: noDb, params: { id: "x" } });
          expect([m, refused.status, await refused.json()]).toEqual([
            m,
            403,
            { error: `Your role (${outsider}) may not use this.`, issues: [] },
          ]);
        }
      });

      it("checks the origin and the content type of every state-changing request", async () => {
        const mod = (await import(path.join(root, file))) as Record<string, RouteHandler<unknown>>;
        for (const m of METHODS.filter((x) => x in mod && MUTATING.has(x))) {
          const h = mod[m];
          const user = userWith(rolesAllowed(h)[0]);
          const opts = { user, db: noDb, params: { id: "00000000-0000-4000-8000-000000000003" } };
          if (h.rule.check !== "payment-signature") {
            for (const headers of [{}, { origin: "https://elsewhere.example" }, { "sec-fetch-site": "cross-site" }] as Record<
              string,
              string
            >[]) {
              const res = await h.handle(
                new Request(`${ORIGIN}/x`, { method: m, headers: { "content-type": "application/json", ...headers }, body: "{}" }),
                opts,
              );
              expect([m, res.status, await res.json()]).toEqual([m, 403, { error: NOT_FROM_OUR_PAGES, issues: [] }]);
            }
          }
          const plain = await h.handle(
            new Request(`${ORIGIN}/x`, { method: m, headers: { origin: ORIGIN, "content-type": "text/plain" }, body: "x" }),
            opts,
          );
          expect([m, plain.status], `${m} refuses a text/plain body`).toEqual([m, 415]);
          expect((await plain.json()).issues).toEqual([]);
        }
      });

      it("refuses a text the database cannot store, naming the field, before the handler runs (unless it takes texts as sent)", async () => {
        const mod = (await import(path.join(root, file))) as Record<string, RouteHandler<unknown>>;
        for (const m of METHODS.filter((x) => x in mod)) {
          const h = mod[m];
          if (h.rule.check === "payment-signature" || h.rule.check === "next-auth") continue;
          const opts = { user: userWith(rolesAllowed(h)[0]), db: noDb, params: { id: "00000000-0000-4000-8000-000000000003" } };
          const headers = { origin: ORIGIN, "content-type": "application/json" };
          if (h.rule.readsQuery) {
            const res = await h.handle(
              new Request(`${ORIGIN}/x?q=a%00b`, { method: m, headers, ...(MUTATING.has(m) ? { body: "{}" } : {}) }),
              opts,
            );
            const issues = ((await res.json()) as { issues: { path: string; message: string }[] }).issues;
            expect([m, res.status, issues.filter((x) => x.path === "q")]).toEqual([
              m,
              400,
              [{ path: "q", message: "Search holds a NUL character, which cannot be stored: retype it." }],
            ]);
          }
          if (!h.rule.takes.includes("application/json")) continue;
          const hostile = JSON.stringify({ note: "bore \u0000 ok", lines: [{ description: "shim \ud83d" }] });
          const res = await h.handle(new Request(`${ORIGIN}/x`, { method: m, headers, body: hostile }), opts);
          if (h.rule.textsTakenAsSent) {
            // these check each item on their own (the sync batch, discards, an ended session's hand-over)
            expect(TEXTS_TAKEN_AS_SENT, `${m} takes texts as sent only as a listed exception`).toContain(file);
            continue;
          }
          // refused before the handler (which would fail on this test's stand-in database: 503), with each
          // field named: in the words of the field's own rule where it has one (a wrong type, a text rule),
          // else "<label> holds a NUL character…" by the label the person sees (a route may give its own);
          // a template file's paths read as in the file ("lines[0].description")
          const issues = ((await res.json()) as { issues: { path: string; message: string }[] }).issues;
          expect([m, res.status === 400 || res.status === 422]).toEqual([m, true]);
          const at = (p: string) => issues.filter((x) => x.path.replace(/\[(\d+)\]/g, ".$1") === p).map((x) => x.message);
          expect(at("note"), `${m} names the note`).not.toEqual([]);
          expect([...at("lines.0.description"), ...at("lines.0"), ...at("lines")], `${m} names the line`).not.toEqual([]);
          if (!at("note").some((x) => x.includes("NUL character")))
            expect(at("note").join(" "), `${m}: the note's own rule speaks instead`).toMatch(/^Note[^:]*: /);
        }
      });
    });
  }

  it("lists no public route that is not a route", () => {
    for (const file of Object.keys(PUBLIC)) expect(files).toContain(file);
  });
});
