import type { Kysely } from "kysely";
import type { Database } from "../schema";
import { receiveDelivery } from "../stock/receive";
import { insertAssignedDemoJobs } from "./demo-late-work";
import { demoJobExists, demoUserId } from "./demo-lookups";

// Invented stock for the demo shop, and two jobs to fit it on: work orders 1070–1071 (tags
// GSW-0070, GSW-0071), in build on the demo bottom-end procedure, assigned to Tomas Reyes.
// One delivery from an invented supplier: rod bolts by the batch, two serial-numbered forged
// pistons, and main-bearing shells whose low-stock level is already reached.

const BIKES = [
  { number: 1070, tag: "GSW-0070", make: "Corran", model: "Twin 900", year: 2017, cc: 898, colour: "Teal" },
  { number: 1071, tag: "GSW-0071", make: "Halden", model: "Tracker 650", year: 2021, cc: 649, colour: "Grey" },
];

/** Whether the demo stock is on file (a database seeded before it existed gets it on the next seed). */
export const demoStockExists = (db: Kysely<Database>, shopId: string) => demoJobExists(db, shopId, BIKES[0].number);

export async function seedDemoStock(db: Kysely<Database>, shopId: string): Promise<void> {
  await insertAssignedDemoJobs(db, shopId, BIKES, ["bottom-end-assembly"], "Bottom-end rebuild with parts from stock");
  const officeId = await demoUserId(db, shopId, "maren@gannet-street.test");
  const office = { id: officeId, shopId, role: "office" as const, name: "Maren", email: "maren@gannet-street.test", customerId: null };
  await receiveDelivery(db, office, {
    supplier: "Tidewater Engine Spares",
    reference: "TES-40917",
    lines: [
      {
        partNumber: "GSE-RB-900",
        description: "Connecting-rod bolt, 3/8 in",
        location: "Shelf B2",
        batch: "RB-2604",
        quantity: 24,
        lowStockAt: 8,
      },
      { partNumber: "GSE-PST-8800", description: "Forged piston, 88.00 mm", location: "Cage 1", serial: "FP-88-1041", quantity: 1 },
      {
        partNumber: "GSE-PST-8800",
        description: "Forged piston, 88.00 mm",
        location: "Cage 1",
        serial: "FP-88-1042",
        quantity: 1,
        lowStockAt: 1,
      },
      {
        partNumber: "GSE-MB-STD",
        description: "Main-bearing shell, standard",
        location: "Shelf A1",
        batch: "MB-1187",
        quantity: 4,
        lowStockAt: 6,
      },
    ],
  });
}
