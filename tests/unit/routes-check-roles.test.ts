import { readdirSync, readFileSync, statSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";

// Every route handler checks who is asking before it does anything: through `guarded(area, …)` or
// `requireApiArea(area)`. The few that cannot are listed here with the check they make instead,
// and that check is looked for in their code. A new route without a check fails this test.

const root = path.resolve(import.meta.dirname, "../..");

function routeFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const full = path.join(dir, name);
    if (statSync(full).isDirectory()) return routeFiles(full);
    return name === "route.ts" ? [full] : [];
  });
}

const EXCEPTIONS: Record<string, { why: string; mustContain: Array<{ file: string; text: string }> }> = {
  "app/api/auth/[...nextauth]/route.ts": {
    why: "next-auth's own sign-in endpoints (rate-limited in the credentials check)",
    mustContain: [{ file: "app/api/auth/[...nextauth]/route.ts", text: "NextAuth(" }],
  },
  "app/api/payments/webhook/route.ts": {
    why: "called by the payment service, not a person: the signature is the check",
    mustContain: [{ file: "app/_server/payment-webhook.ts", text: "verifyPaymentWebhook(rawBody, signature" }],
  },
  "app/api/me/route.ts": {
    why: "any signed-in person may ask who they are; 401 when signed out",
    mustContain: [{ file: "app/api/me/route.ts", text: "status: 401" }],
  },
  "app/api/bench/photos/[id]/route.ts": {
    why: "the handlers take the user as an argument (for tests) and check the role themselves",
    mustContain: [
      { file: "app/api/bench/photos/[id]/route.ts", text: "currentUser()" },
      { file: "app/api/bench/photos/handlers.ts", text: 'canReach(user.role, "bench")' },
    ],
  },
};

const HANDLER = /export\s+(?:const\s+(GET|POST|PUT|PATCH|DELETE)\s*=|async\s+function\s+(GET|POST|PUT|PATCH|DELETE)\b)/g;

describe("route handlers check the role", () => {
  const files = routeFiles(path.join(root, "app/api")).map((f) => path.relative(root, f).split(path.sep).join("/"));

  it("finds the route handlers", () => {
    expect(files.length).toBeGreaterThan(30);
  });

  for (const file of files) {
    it(file, () => {
      const code = readFileSync(path.join(root, file), "utf8");
      const methods = [...code.matchAll(HANDLER)].map((m) => m[1] ?? m[2]);
      const exception = EXCEPTIONS[file];
      if (exception) {
        for (const need of exception.mustContain) expect(readFileSync(path.join(root, need.file), "utf8"), `${need.file} (${exception.why})`).toContain(need.text);
        return;
      }
      expect(methods.length, "exports at least one handler").toBeGreaterThan(0);
      // Each exported handler is either built by guarded(…) or calls requireApiArea(…) in its body.
      const guardedCount = (code.match(/=\s*guarded(?:<[^>]*>)?\(\s*"/g) ?? []).length;
      const areaChecks = (code.match(/requireApiArea\(\s*"/g) ?? []).length;
      expect(guardedCount + areaChecks, `${methods.join(", ")} each check an area`).toBeGreaterThanOrEqual(methods.length);
    });
  }

  it("lists no exception that is not a route", () => {
    for (const file of Object.keys(EXCEPTIONS)) expect(files).toContain(file);
  });
});
