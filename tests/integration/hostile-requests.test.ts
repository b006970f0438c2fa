import path from "node:path";
import { expect, it } from "vitest";
import type { RouteHandler } from "@/app/_server/route";
import type { Role } from "@/lib/auth/roles";
import type { SessionUser } from "@/lib/auth/session-user";
import { ROOT as root, rolesAllowed, routeFiles } from "../support/route-handlers";
import { createShopFixture } from "./support/shop-fixture";
import { appRequest } from "./support/route-calls";
import { useTestDb } from "./support/test-db";

// Hostile input is normal input: every route handler of app/api, called by a role that may use it
// against real PostgreSQL, with path values, queries and bodies that no page of the app sends —
// numbers past any integer column, a broken %-escape, a NUL, year 0000, an existing job's id where
// another kind of id belongs — answers in words (4xx), never with a server error. (Each route's own
// tests check what it answers; this holds them all to the floor.)

const db = useTestDb();
const METHODS = ["GET", "POST", "PUT", "PATCH", "DELETE"] as const;

it("no route answers hostile paths, queries or bodies with a server error", async () => {
  const fx = await createShopFixture(db);
  const userOf = (role: Role): SessionUser => ({
    ...(role === "mechanic" ? fx.users.mechanic : fx.users[role]),
    customerId: role === "customer" ? fx.customerId : null,
  });
  const pathValues = ["99999999999", "%E0%A4%A", "a\u0000b", "00000000-0000-4000-8000-000000000009", fx.workOrderId, "-1", "1e400"];
  const queries = [
    "version=99999999999",
    "page=99999999999&size=99999999999",
    "page=-1",
    "from=0000-01-01&to=9999-12-31",
    "from=2026-02-30",
    "since=99999999999999999999",
    "q=%25%5C_",
    "job=99999999999",
    "sort=zzz&dir=up",
  ];
  const bodies = [
    { id: fx.workOrderId, number: 99999999999, page: 1e10, at: "0000-01-01T00:00:00Z" },
    { note: "a", amountMinor: 1e300, quantity: -1, date: "2026-02-30" },
  ];
  const serverErrors: string[] = [];
  let calls = 0;
  for (const file of routeFiles()) {
    const mod = (await import(path.join(root, file))) as Record<string, RouteHandler<unknown>>;
    const names = [...file.matchAll(/\[(?:\.\.\.)?([A-Za-z]+)\]/g)].map((m) => m[1]);
    for (const m of METHODS.filter((x) => x in mod)) {
      const h = mod[m];
      if (h.rule.check) continue; // the public routes check a signature, a link or next-auth's token first
      const user = userOf(rolesAllowed(h)[0]);
      for (const value of pathValues) {
        const params = Object.fromEntries(names.map((n) => [n, value]));
        const requests =
          m === "GET"
            ? queries.map((q) => appRequest(`/api/x?${q}`))
            : bodies.map((b) =>
                appRequest("/api/x", { method: m, headers: { "content-type": "application/json" }, body: JSON.stringify(b) }),
              );
        for (const req of requests) {
          const res = await h.handle(req, { user, db, params });
          calls++;
          if (res.status >= 500) serverErrors.push(`${m} ${file} ${JSON.stringify(params)} ${req.url} → ${res.status}`);
        }
      }
    }
  }
  expect(calls).toBeGreaterThan(500);
  expect(serverErrors).toEqual([]);
}, 300_000);
