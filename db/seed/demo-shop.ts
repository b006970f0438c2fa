import bcrypt from "bcryptjs";
import type { Kysely } from "kysely";
import { DEMO_TEMPLATES } from "@/lib/procedures/demo-templates";
import type { WorkOrderStatus } from "@/lib/work-orders/status";
import type { Database } from "../schema";
import { DEMO_PASSWORD, DEMO_USERS } from "./demo-people";
import { createTemplateVersion } from "../templates/versions";
import { insertDemoBike } from "./demo-bike";
import { seedDemoAftercare } from "./demo-aftercare";
import { seedDemoCalendar } from "./demo-calendar";
import { seedDemoCustomerContact } from "./demo-customer-contact";
import { seedDemoBenchChecks } from "./demo-bench-checks";
import { seedDemoDyno } from "./demo-dyno";
import { seedDemoBenchTime } from "./demo-bench-time";
import { seedDemoLateWork } from "./demo-late-work";
import { seedDemoOffice } from "./demo-office";
import { seedDemoReview } from "./demo-review";
import { seedDemoStock } from "./demo-stock";
import { seedDemoTurboPlan } from "./demo-turbo-plan";

// An invented workshop for the demo and the browser tests. All names are made up.
const DEMO_SHOP_SLUG = "gannet-street";

const CUSTOMERS = [
  { key: "felix", name: "Felix Amadi", email: "felix.amadi@example.test", phone: "+44 7700 900101" },
  { key: "ruth", name: "Ruth Calloway", email: "ruth.calloway@example.test", phone: "+44 7700 900202" },
  { key: "sam", name: "Sam Okafor", email: "sam.okafor@example.test", phone: "+44 7700 900303" },
  { key: "noor", name: "Noor Haddad", email: "noor.haddad@example.test", phone: "+44 7700 900404" },
];

// Makes and models are invented too.
const BIKES = [
  { key: "corvid", customer: "felix", make: "Corvid", model: "RX1000 Turbo", year: 2011, cc: 998, colour: "Graphite", tag: "GSW-0001" },
  { key: "halden", customer: "felix", make: "Halden", model: "Tracer 900", year: 2017, cc: 898, colour: "Red", tag: "GSW-0002" },
  { key: "ostrava", customer: "ruth", make: "Ostrava", model: "S4 Street", year: 2008, cc: 1052, colour: "White", tag: "GSW-0003" },
  { key: "marlin", customer: "sam", make: "Marlin", model: "Sixty Sport", year: 2015, cc: 636, colour: "Blue", tag: "GSW-0004" },
  { key: "corvid2", customer: "sam", make: "Corvid", model: "RX1000", year: 2013, cc: 998, colour: "Black", tag: "GSW-0005" },
  { key: "vireo", customer: "sam", make: "Vireo", model: "Nine Fifty", year: 2014, cc: 948, colour: "Green", tag: "GSW-0006" },
  { key: "kestrel", customer: "noor", make: "Kestrel", model: "Sprint 800", year: 2012, cc: 799, colour: "Yellow", tag: "GSW-0007" },
];

const WORK_ORDERS: Array<{
  bike: string;
  title: string;
  status: WorkOrderStatus;
  complaint: string;
  odometer: number;
  mechanic?: string;
  templates: string[];
  /** Its own number, outside the run 1001, 1002, … (which the browser tests' new jobs continue). */
  number?: number;
}> = [
  {
    bike: "corvid",
    title: "Turbo engine rebuild, lower compression, charge-air rework",
    status: "in_build",
    complaint: "Lost power and smoked after a hot day at 9 psi; wants a build that holds 10 psi reliably.",
    odometer: 41250,
    mechanic: "mechanic",
    templates: ["bottom-end-assembly", "cylinder-head-installation"],
  },
  {
    bike: "ostrava",
    title: "Head gasket and valve clearance service",
    status: "in_build",
    complaint: "Coolant loss, white smoke on cold start.",
    odometer: 58800,
    mechanic: "mechanic2",
    templates: ["cylinder-head-installation"],
  },
  {
    bike: "halden",
    title: "Intake and exhaust upgrade, dyno tune",
    status: "quoted",
    complaint: "Wants more midrange.",
    odometer: 12040,
    templates: [],
  },
  {
    bike: "marlin",
    title: "Rattle from top end at idle",
    status: "booked_in",
    complaint: "Tapping noise from the cam cover when warm.",
    odometer: 30110,
    templates: [],
  },
  {
    bike: "corvid2",
    title: "Annual service and dyno check",
    status: "handed_over",
    complaint: "Routine service.",
    odometer: 22300,
    mechanic: "mechanic",
    templates: [],
  },
  {
    bike: "vireo",
    title: "Bottom-end refresh and head service",
    status: "in_build",
    complaint: "Knock from the bottom end under load; wants it freshened before track days.",
    odometer: 36400,
    mechanic: "mechanic",
    templates: ["bottom-end-assembly", "cylinder-head-installation"],
  },
  {
    // Kept for the review round trip (measure, sign off, send back, redo, approve) so it starts clean.
    bike: "kestrel",
    title: "Bottom-end measure-up after an oil-pressure warning",
    status: "in_build",
    complaint: "Oil-pressure light flickered at hot idle; wants the bottom end measured before a season of racing.",
    odometer: 27950,
    mechanic: "mechanic",
    templates: ["bottom-end-assembly"],
  },
  {
    // Waiting in review with nothing done on the bench: the browser test of the gates on "ready" and
    // "handed over" and the office's override uses it.
    bike: "halden",
    title: "Valve clearance check before the track season",
    status: "in_review",
    complaint: "Wants the valve clearances checked and the head looked over before a season of track days.",
    odometer: 12980,
    mechanic: "mechanic2",
    templates: ["cylinder-head-installation"],
    number: 1010,
  },
];

/** The demo shop's id, or null when it has not been seeded. */
export async function demoShopId(db: Kysely<Database>): Promise<string | null> {
  const row = await db.selectFrom("shops").select("id").where("slug", "=", DEMO_SHOP_SLUG).executeTakeFirst();
  return row?.id ?? null;
}

export async function seedDemoShop(db: Kysely<Database>): Promise<{ shopId: string }> {
  const { id: shopId } = await db
    .insertInto("shops")
    .values({ name: "Gannet Street Engine Works", slug: DEMO_SHOP_SLUG, time_zone: "Europe/London", currency: "GBP", tax_rate_bp: 2000 })
    .returning("id")
    .executeTakeFirstOrThrow();

  const customerIds = new Map<string, string>();
  for (const c of CUSTOMERS) {
    const { id } = await db
      .insertInto("customers")
      .values({ shop_id: shopId, name: c.name, email: c.email, phone: c.phone })
      .returning("id")
      .executeTakeFirstOrThrow();
    customerIds.set(c.key, id);
  }

  const hash = await bcrypt.hash(DEMO_PASSWORD, 10);
  const userIds = new Map<string, string>();
  for (const u of DEMO_USERS) {
    const { id } = await db
      .insertInto("users")
      .values({
        shop_id: shopId,
        email: u.email,
        name: u.name,
        role: u.role,
        password_hash: hash,
        customer_id: u.customerKey ? customerIds.get(u.customerKey)! : null,
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    userIds.set(u.key, id);
  }

  const bikeIds = new Map<string, string>();
  for (const b of BIKES) bikeIds.set(b.key, await insertDemoBike(db, shopId, customerIds.get(b.customer)!, b));

  const versionIds = new Map<string, string>();
  for (const t of DEMO_TEMPLATES) {
    const { versionId } = await createTemplateVersion(db, shopId, t, userIds.get("office")!);
    versionIds.set(t.key, versionId);
  }

  for (const [i, w] of WORK_ORDERS.entries()) {
    const { id } = await db
      .insertInto("work_orders")
      .values({
        shop_id: shopId,
        bike_id: bikeIds.get(w.bike)!,
        number: w.number ?? 1001 + i,
        title: w.title,
        status: w.status,
        complaint: w.complaint,
        intake_odometer_km: w.odometer,
        assigned_mechanic_id: w.mechanic ? userIds.get(w.mechanic)! : null,
        closed_at: w.status === "handed_over" ? new Date() : null,
      })
      .returning("id")
      .executeTakeFirstOrThrow();
    await db
      .insertInto("work_order_transitions")
      .values({ work_order_id: id, from_status: null, to_status: w.status, by_user_id: userIds.get("office")!, note: "demo data" })
      .execute();
    for (const [position, key] of w.templates.entries()) {
      await db
        .insertInto("job_procedures")
        .values({ work_order_id: id, template_version_id: versionIds.get(key)!, position })
        .execute();
    }
  }
  await seedDemoLateWork(db, shopId);
  await seedDemoBenchChecks(db, shopId);
  await seedDemoDyno(db, shopId);
  await seedDemoTurboPlan(db, shopId);
  await seedDemoReview(db, shopId);
  await seedDemoOffice(db, shopId, userIds.get("office")!, userIds.get("mechanic")!);
  await seedDemoAftercare(db, shopId);
  await seedDemoBenchTime(db, shopId);
  await seedDemoCalendar(db, shopId);
  await seedDemoStock(db, shopId);
  await seedDemoCustomerContact(db, shopId);
  return { shopId };
}
