import { randomUUID } from "node:crypto";
import type { Kysely } from "kysely";
import { formatStamp } from "@/lib/sync/hlc";
import type { Database } from "../schema";
import { mergeBatch } from "../sync/merge";
import { insertDemoBike } from "./demo-bike";
import { demoBottomEndJobBasics } from "./demo-late-work";
import { insertQuotedDemoJob } from "./demo-quoted-job";

// Two invented jobs for time at the bench (and the browser tests of it): work orders 1060–1061,
// tags GSW-0060…GSW-0061, in build on the demo bottom-end procedure, each with an approved quote
// whose labour lines give the hours to compare the clocked time with.
// - 1060: assigned to Tomas Reyes, nobody has clocked on yet (the browser test clocks on and off);
// - 1061: assigned to Priya Vance, who clocked on yesterday morning and never clocked off — the
//   clock a supervisor closes with a reason.

const BIKES = [
  { number: 1060, tag: "GSW-0060", make: "Brackwater", model: "Fell 700", year: 2018, cc: 689, colour: "Grey", mechanic: "tomas" },
  { number: 1061, tag: "GSW-0061", make: "Tarrant", model: "Ridge 1100", year: 2013, cc: 1098, colour: "Teal", mechanic: "priya" },
] as const;

const LABOUR = [
  { kind: "labour" as const, description: "Strip, measure and rebuild the bottom end", partNumber: null, qty: 350, price: 6800 },
  { kind: "part" as const, description: "Main and big-end bearing shells", partNumber: "GS-BRG-SET", qty: 100, price: 14500 },
];

const DEVICE = "demo-tablet-6";

/** Whether jobs 1060–1061 are on file (a database seeded before they existed gets them on the next seed). */
export async function demoBenchTimeExists(db: Kysely<Database>, shopId: string): Promise<boolean> {
  const row = await db.selectFrom("work_orders").select("id").where("shop_id", "=", shopId).where("number", "=", 1060).executeTakeFirst();
  return Boolean(row);
}

/** Writes jobs 1060–1061 for the demo shop, with their quotes and Priya's forgotten clock on 1061. */
export async function seedDemoBenchTime(db: Kysely<Database>, shopId: string): Promise<void> {
  const user = async (email: string) =>
    db
      .selectFrom("users")
      .select(["id", "name", "email"])
      .where("shop_id", "=", shopId)
      .where("email", "=", email)
      .executeTakeFirstOrThrow();
  const office = await user("maren@gannet-street.test");
  const people = { tomas: await user("tomas@gannet-street.test"), priya: await user("priya@gannet-street.test") };
  const { customerId, bottomEndVersionId } = await demoBottomEndJobBasics(db, shopId);
  const jobs: Record<number, string> = {};
  for (const b of BIKES) {
    const bikeId = await insertDemoBike(db, shopId, customerId, b);
    const { workOrderId } = await insertQuotedDemoJob(db, {
      shopId,
      bikeId,
      number: b.number,
      title: "Bottom-end rebuild, bearings and a measured build",
      complaint: "Rumble from the bottom end at idle; wants it rebuilt with the clearances written down.",
      odometerKm: 40_000 + b.number,
      mechanicId: people[b.mechanic].id,
      officeId: office.id,
      templateVersionId: bottomEndVersionId,
      lines: LABOUR,
      depositMinor: 0,
    });
    jobs[b.number] = workOrderId;
  }
  // Priya clocked on 1061 yesterday at 08:10 (server time) and never clocked off.
  const yesterday = new Date();
  yesterday.setDate(yesterday.getDate() - 1);
  yesterday.setHours(8, 10, 0, 0);
  const at = yesterday.getTime();
  const priya = people.priya;
  await mergeBatch(
    db,
    { id: priya.id, shopId, role: "mechanic", name: priya.name, email: priya.email, customerId: null },
    {
      deviceId: DEVICE,
      cursor: null,
      operations: [
        {
          id: randomUUID(),
          kind: "clock.on",
          workOrderId: jobs[1061],
          authorId: priya.id,
          deviceId: DEVICE,
          deviceTime: new Date(at).toISOString(),
          stamp: formatStamp({ wallMs: at, counter: 0, deviceId: DEVICE }),
          payload: { clockId: randomUUID(), startedAt: new Date(at).toISOString() },
        },
      ],
    },
  );
}
