import net from "node:net";
import { afterAll, beforeAll, describe, expect, inject, it, vi } from "vitest";
import { route } from "@/app/_server/route";
import { GET as benchJobs } from "@/app/api/bench/jobs/route";
import { POST as sync } from "@/app/api/sync/route";
import { startSession } from "@/db/auth/sessions";
import { createDb, type Db } from "@/db/setup/client";
import { DATABASE_NOT_ANSWERING, UNEXPECTED_FAILURE } from "@/lib/errors";
import { createShopFixture, type ShopFixture } from "./support/shop-fixture";
import { appRequest } from "./support/route-calls";
import { useTestDb } from "./support/test-db";

// Server errors have one answer. The session lookup here is the real one (lookUpSession: the
// server-side session row, then the user), with only the signed cookie's claim stood in for
// (next-auth reads it from the request, which a direct handler call has none of). A database that
// refuses the connection, drops it in the middle of the session lookup, or never answers gives
// 503 with the one error body `{ error, issues }`, on a bench route and on /api/sync alike; any
// other unexpected exception in a handler gives 503 too, with the same body (its own message). The tablet treats every
// 5xx as "kept, try again or split" (tests/unit/client/sync-not-stored.test.ts).

const claim = vi.hoisted(() => ({ current: null as { userId: string; sessionId: string } | null }));
vi.mock("@/app/_server/signed-in", () => ({ signedInClaim: async () => claim.current }));

const db = useTestDb();
let fx: ShopFixture;
const servers: net.Server[] = [];
const pools: Db[] = [];

beforeAll(async () => {
  fx = await createShopFixture(db);
  const sessionId = await startSession(db, fx.users.mechanic, { address: "127.0.0.1", userAgent: "route-server-errors" });
  claim.current = { userId: fx.users.mechanic.id, sessionId };
});

afterAll(async () => {
  await Promise.all(pools.map((p) => p.destroy().catch(() => undefined)));
  for (const s of servers) s.close();
});

/** A TCP server on a free local port, doing `onSocket` with each connection. */
async function fakeServer(onSocket: (socket: net.Socket) => void): Promise<number> {
  const server = net.createServer(onSocket);
  servers.push(server);
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  return (server.address() as net.AddressInfo).port;
}

/** A pool on `port` of this machine, with the test database's name and user. */
function poolOn(port: number, connectTimeoutMs?: number): Db {
  const url = new URL(inject("databaseUrl"));
  url.hostname = "127.0.0.1";
  url.port = String(port);
  const pool = createDb(url.toString(), 1, { connectTimeoutMs });
  pools.push(pool);
  return pool;
}

/**
 * A way to the real test database that cuts both sides the moment the client sends a query naming
 * `table`: the database drops in the middle of that query.
 */
async function droppingOn(table: string): Promise<{ db: Db; drops: () => number }> {
  const real = new URL(inject("databaseUrl"));
  let drops = 0;
  const port = await fakeServer((client) => {
    const upstream = net.connect(Number(real.port || 5432), real.hostname);
    client.on("data", (chunk) => {
      if (chunk.toString("latin1").includes(`"${table}"`)) {
        drops++;
        client.destroy();
        upstream.destroy();
        return;
      }
      upstream.write(chunk);
    });
    upstream.on("data", (chunk) => client.write(chunk));
    client.on("error", () => upstream.destroy());
    upstream.on("error", () => client.destroy());
    client.on("close", () => upstream.destroy());
    upstream.on("close", () => client.destroy());
  });
  return { db: poolOn(port), drops: () => drops };
}

const syncPost = () =>
  appRequest("/api/sync", {
    method: "POST",
    headers: { "content-type": "application/json" },
    body: JSON.stringify({ deviceId: "tab-errors", cursor: null, operations: [] }),
  });

/** Status, body and cache header of an answer. */
async function answer(res: Response) {
  return { status: res.status, body: await res.json(), cache: res.headers.get("cache-control") };
}
const unavailable = { status: 503, body: { error: DATABASE_NOT_ANSWERING, issues: [] }, cache: "no-store" };

describe("a database that does not answer during the session lookup", () => {
  it("the same session, on the real database, is looked up and lets the mechanic in (the path the failures below take)", async () => {
    const jobs = await benchJobs.handle(appRequest("/api/bench/jobs"), { db });
    expect(jobs.status).toBe(200);
    const merged = await sync.handle(syncPost(), { db });
    expect(merged.status).toBe(200);
    expect(await merged.json()).toMatchObject({ accepted: [], refused: [], pending: [] });
  });

  it("refusing the connection: 503 with the one body on a bench route and on /api/sync", async () => {
    const gone = poolOn(1);
    expect(await answer(await benchJobs.handle(appRequest("/api/bench/jobs"), { db: gone }))).toEqual(unavailable);
    expect(await answer(await sync.handle(syncPost(), { db: gone }))).toEqual(unavailable);
  });

  it("dropping the connection in the middle of the session lookup: 503 with the one body on both", async () => {
    const dropping = await droppingOn("sessions");
    expect(await answer(await benchJobs.handle(appRequest("/api/bench/jobs"), { db: dropping.db }))).toEqual(unavailable);
    expect(await answer(await sync.handle(syncPost(), { db: dropping.db }))).toEqual(unavailable);
    expect(dropping.drops()).toBe(2);
  });

  it("accepting the connection and never answering: 503 with the one body once the pool gives up", async () => {
    const silent: net.Socket[] = [];
    const port = await fakeServer((socket) => {
      silent.push(socket);
      socket.on("error", () => undefined);
    });
    const mute = poolOn(port, 300);
    expect(await answer(await benchJobs.handle(appRequest("/api/bench/jobs"), { db: mute }))).toEqual(unavailable);
    expect(await answer(await sync.handle(syncPost(), { db: mute }))).toEqual(unavailable);
    expect(silent.length).toBeGreaterThanOrEqual(2);
    for (const s of silent) s.destroy();
  });
});

describe("any other unexpected exception in a handler", () => {
  const failing = { status: 503, body: { error: UNEXPECTED_FAILURE, issues: [] }, cache: "no-store" };
  const asMechanic = () => ({ ...fx.users.mechanic, customerId: null });

  it("answers 503 with the same body shape: a handler that throws, and /api/sync when the merge throws a non-database error", async () => {
    const throwing = route({ access: { area: "bench" } }, async (): Promise<never> => {
      throw new TypeError("Cannot read properties of undefined (reading 'id')");
    });
    expect(await answer(await throwing.handle(appRequest("/api/bench/anything"), { user: asMechanic(), db }))).toEqual(failing);

    // a database handle whose transaction fails with a programming error, not a database failure
    const broken = new Proxy(db, {
      get(target, prop, receiver) {
        if (prop === "transaction") return () => ({ execute: async () => Promise.reject(new RangeError("Invalid array length")) });
        return Reflect.get(target, prop, receiver);
      },
    });
    expect(await answer(await sync.handle(syncPost(), { user: asMechanic(), db: broken }))).toEqual(failing);
  });
});
