/**
 * A year of a busy shop: the week plan of one resource and the stock's batch search, on 2,000 jobs,
 * 20,000 bookings and 50,000 stock movements, beside the same reads on a shop a hundredth that
 * size (ratios), from one run on one machine.
 * `npx tsx --conditions=react-server tests/bench/stock-week.ts`. Figures only, no pass or fail.
 *
 * The rows are written by SQL in bulk (generate_series) into a throwaway database: bookings back
 * to back on 8 resources (10 one-hour slots a day, 250 days), 500 stock items with 10 delivered
 * batches each, and per batch its receipt, 2 reservations and 7 draws at fits (each with its part
 * fitted). The reads are the app's own: `listWeek` (db/calendar) and `searchStockByCode` (db/stock).
 */
import os from "node:os";
import { pathToFileURL } from "node:url";
import { sql, type Kysely } from "kysely";
import { listWeek } from "@/db/calendar/bookings";
import type { Database } from "@/db/schema";
import { searchStockByCode } from "@/db/stock/search";
import { createShopFixture } from "../integration/support/shop-fixture";
import { withThrowawayDb } from "./throwaway-db";

const REPEATS = 25;
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

interface Size {
  jobs: number;
  resources: number;
  days: number;
  items: number;
}
const LARGE: Size = { jobs: 2_000, resources: 8, days: 250, items: 500 };
const SMALL: Size = { jobs: 20, resources: 2, days: 10, items: 5 };
const LOTS_PER_ITEM = 10;
const SLOTS_PER_DAY = 10;

interface ShopFigures {
  jobs: number;
  bookings: number;
  movements: number;
  weekMs: number;
  weekRows: number;
  searchMs: number;
  searchRows: number;
  missMs: number;
}

async function fill(db: Kysely<Database>, size: Size) {
  const fx = await createShopFixture(db);
  const shop = fx.shopId;
  const by = fx.users.office.id;
  await sql`
    INSERT INTO bikes (shop_id, customer_id, make, model, year, tag_code, displacement_cc)
    SELECT ${shop}::uuid, ${fx.customerId}::uuid, 'Bench', 'Load ' || i, 2015, ${fx.bike.tag_code} || '-' || i, 750
    FROM generate_series(1, ${size.jobs}) i;
    `.execute(db);
  await sql`
    INSERT INTO work_orders (shop_id, bike_id, number, title, status, intake_odometer_km)
    SELECT ${shop}::uuid, b.id, 100 + row_number() OVER (ORDER BY b.tag_code), 'Year of work', 'in_build', 1000
    FROM bikes b WHERE b.shop_id = ${shop}::uuid AND b.tag_code LIKE ${fx.bike.tag_code + "-%"}
  `.execute(db);
  await sql`
    INSERT INTO shop_resources (shop_id, kind, name, created_by)
    SELECT ${shop}::uuid, 'bay', 'Bay ' || r, ${by}::uuid FROM generate_series(1, ${size.resources}) r
  `.execute(db);
  // Back-to-back one-hour bookings from 08:00, every day from Monday 5 January 2026.
  await sql`
    WITH jobs AS (SELECT id, row_number() OVER (ORDER BY number) - 1 AS k FROM work_orders WHERE shop_id = ${shop}::uuid AND number >= 100),
    res AS (SELECT id, row_number() OVER (ORDER BY name) - 1 AS r FROM shop_resources WHERE shop_id = ${shop}::uuid),
    slots AS (
      SELECT res.id AS resource_id, res.r, d, s FROM res, generate_series(0, ${size.days - 1}) d, generate_series(0, ${SLOTS_PER_DAY - 1}) s
    )
    INSERT INTO bookings (shop_id, resource_id, work_order_id, during, booked_by)
    SELECT ${shop}::uuid, slots.resource_id, jobs.id,
      tstzrange(timestamptz '2026-01-05 08:00Z' + d * interval '1 day' + s * interval '1 hour',
                timestamptz '2026-01-05 09:00Z' + d * interval '1 day' + s * interval '1 hour', '[)'),
      ${by}::uuid
    FROM slots JOIN jobs ON jobs.k = (slots.r * 7919 + slots.d * ${SLOTS_PER_DAY} + slots.s) % ${size.jobs}
  `.execute(db);
  // Stock: items, one delivery, lots, and per lot its receipt, 2 reservations and 7 draws at fits.
  await sql`
    INSERT INTO stock_items (shop_id, part_number, part_key, description, created_by)
    SELECT ${shop}::uuid, 'BP-' || lpad(i::text, 5, '0'), 'BP' || lpad(i::text, 5, '0'), 'Bench part ' || i, ${by}::uuid
    FROM generate_series(1, ${size.items}) i
  `.execute(db);
  const delivery = await db
    .insertInto("stock_deliveries")
    .values({ shop_id: shop, supplier: "Bench Supplies", received_by: by })
    .returning("id")
    .executeTakeFirstOrThrow();
  await sql`
    INSERT INTO stock_lots (shop_id, item_id, delivery_id, location, batch, batch_key, received_qty, on_hand, reserved)
    SELECT ${shop}::uuid, i.id, ${delivery.id}::uuid, 'Shelf ' || (n % 40), 'LOT-' || i.part_number || '-' || n, 'LOT' || i.part_key || n, 20, 11, 2
    FROM stock_items i, generate_series(1, ${LOTS_PER_ITEM}) n WHERE i.shop_id = ${shop}::uuid
  `.execute(db);
  await sql`
    WITH lots AS (SELECT id, item_id, row_number() OVER (ORDER BY id) AS k FROM stock_lots WHERE shop_id = ${shop}::uuid),
    jobs AS (SELECT id, row_number() OVER (ORDER BY number) - 1 AS k FROM work_orders WHERE shop_id = ${shop}::uuid AND number >= 100)
    INSERT INTO stock_movements (shop_id, item_id, lot_id, kind, quantity, work_order_id, recorded_by)
    SELECT ${shop}::uuid, lots.item_id, lots.id, 'received', 20, NULL, ${by}::uuid FROM lots
    UNION ALL
    SELECT ${shop}::uuid, lots.item_id, lots.id, 'reserved', 1, jobs.id, ${by}::uuid
    FROM lots, generate_series(0, 1) r, jobs WHERE jobs.k = (lots.k * 13 + r) % ${size.jobs}
  `.execute(db);
  await sql`
    WITH lots AS (
      SELECT l.id, l.item_id, l.batch, i.part_number, row_number() OVER (ORDER BY l.id) AS k
      FROM stock_lots l JOIN stock_items i ON i.id = l.item_id WHERE l.shop_id = ${shop}::uuid
    ),
    jobs AS (SELECT id, row_number() OVER (ORDER BY number) - 1 AS k FROM work_orders WHERE shop_id = ${shop}::uuid AND number >= 100),
    fits AS (
      INSERT INTO parts_fitted (shop_id, work_order_id, part_number, description, batch, quantity, fitted_by, fitted_at)
      SELECT ${shop}::uuid, jobs.id, lots.part_number, 'Bench part', lots.batch, 1, ${fx.users.mechanic.id}::uuid,
        timestamptz '2026-01-05 10:00Z' + ((lots.k * 7 + f) % 360) * interval '1 day'
      FROM lots, generate_series(0, 6) f, jobs WHERE jobs.k = (lots.k * 31 + f) % ${size.jobs}
      RETURNING id, work_order_id, batch
    )
    INSERT INTO stock_movements (shop_id, item_id, lot_id, kind, quantity, work_order_id, part_fitted_id, recorded_by)
    SELECT ${shop}::uuid, lots.item_id, lots.id, 'drawn', 1, fits.work_order_id, fits.id, ${fx.users.mechanic.id}::uuid
    FROM fits JOIN lots ON lots.batch = fits.batch
  `.execute(db);
  await sql`ANALYZE`.execute(db);
  const count = async (table: "bookings" | "stock_movements") =>
    Number((await sql<{ n: string }>`SELECT count(*) AS n FROM ${sql.table(table)} WHERE shop_id = ${shop}::uuid`.execute(db)).rows[0].n);
  const resource = await db.selectFrom("shop_resources").select("id").where("shop_id", "=", shop).orderBy("name").executeTakeFirstOrThrow();
  return { shop, resourceId: resource.id, bookings: await count("bookings"), movements: await count("stock_movements") };
}

async function timed<T>(f: () => Promise<T>): Promise<{ ms: number; last: T }> {
  const times: number[] = [];
  let last!: T;
  for (let i = 0; i < REPEATS; i++) {
    const t = performance.now();
    last = await f();
    times.push(performance.now() - t);
  }
  return { ms: median(times), last };
}

async function measure(db: Kysely<Database>, size: Size): Promise<ShopFigures> {
  const s = await fill(db, size);
  // A week in the middle of the bookings, and a batch halfway down the stock list.
  const monday = size.days > 100 ? "2026-06-01" : "2026-01-12";
  const batch = `lot-bp-${String(Math.ceil(size.items / 2)).padStart(5, "0")}-5`;
  const week = await timed(() => listWeek(db, s.shop, s.resourceId, monday));
  const search = await timed(() => searchStockByCode(db, s.shop, batch));
  const miss = await timed(() => searchStockByCode(db, s.shop, "NOT-A-BATCH-0000"));
  return {
    jobs: size.jobs,
    bookings: s.bookings,
    movements: s.movements,
    weekMs: week.ms,
    weekRows: week.last.length,
    searchMs: search.ms,
    searchRows: search.last.length,
    missMs: miss.ms,
  };
}

export async function run(): Promise<{ small: ShopFigures; large: ShopFigures }> {
  return withThrowawayDb("stock_week", async (db) => {
    const small = await measure(db, SMALL);
    const large = await measure(db, LARGE);
    return { small, large };
  });
}

export function print({ small, large }: { small: ShopFigures; large: ShopFigures }) {
  const f = (n: number) => n.toFixed(2);
  console.log(`machine: ${os.cpus().length} cores, ${os.cpus()[0]?.model ?? "?"}; median of ${REPEATS} runs each`);
  console.log("shop        jobs  bookings  movements | week ms (rows) | batch search ms (rows) | no-match search ms");
  for (const [name, s] of [
    ["small", small],
    ["busy year", large],
  ] as const)
    console.log(
      `${name.padEnd(10)} ${String(s.jobs).padStart(5)} ${String(s.bookings).padStart(9)} ${String(s.movements).padStart(10)} | ${f(s.weekMs).padStart(7)} (${s.weekRows}) | ${f(s.searchMs).padStart(8)} (${s.searchRows}) | ${f(s.missMs)}`,
    );
  console.log(
    `ratios busy/small: week ${f(large.weekMs / small.weekMs)}×, batch search ${f(large.searchMs / small.searchMs)}×, no-match ${f(large.missMs / small.missMs)}× (the issue asks under 100 ms each on the busy year: week ${f(large.weekMs)} ms, batch search ${f(large.searchMs)} ms)`,
  );
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? "").href) {
  print(await run());
  process.exit(0);
}
