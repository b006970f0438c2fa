import { createDb } from "../client";
import { demoAftercareExists, seedDemoAftercare } from "../../seed/demo-aftercare";
import { demoBenchChecksExist, seedDemoBenchChecks } from "../../seed/demo-bench-checks";
import { demoCalendarExists, seedDemoCalendar } from "../../seed/demo-calendar";
import { demoBenchTimeExists, seedDemoBenchTime } from "../../seed/demo-bench-time";
import { demoExtraWorkExists, seedDemoExtraWork } from "../../seed/demo-extra-work";
import { demoLateWorkExists, seedDemoLateWork } from "../../seed/demo-late-work";
import { demoShopId, seedDemoShop } from "../../seed/demo-shop";
import { demoStockExists, seedDemoStock } from "../../seed/demo-stock";

// Seeds the invented demo workshop once; a second run leaves existing data alone. A shop seeded
// before demo jobs 1030–1032, 1020–1022, 1040–1041 or 1060–1061 existed gets them (once) without anything else being touched.
const db = createDb(undefined, 1);
try {
  const shopId = await demoShopId(db);
  if (shopId === null) {
    await seedDemoShop(db);
    await seedDemoExtraWork(db, (await demoShopId(db))!);
    console.log("[seed] demo shop written");
  } else {
    console.log("[seed] demo shop already present");
    if (!(await demoLateWorkExists(db, shopId))) {
      await seedDemoLateWork(db, shopId);
      console.log("[seed] demo jobs 1030–1032 added");
    }
    if (!(await demoBenchChecksExist(db, shopId))) {
      await seedDemoBenchChecks(db, shopId);
      console.log("[seed] demo jobs 1020–1022 added");
    }
    if (!(await demoAftercareExists(db, shopId))) {
      await seedDemoAftercare(db, shopId);
      console.log("[seed] demo jobs 1040–1041 (come-backs and reminders) added");
    }
    if (!(await demoBenchTimeExists(db, shopId))) {
      await seedDemoBenchTime(db, shopId);
      console.log("[seed] demo jobs 1060–1061 (time at the bench) added");
    }
    if (!(await demoExtraWorkExists(db, shopId))) {
      await seedDemoExtraWork(db, shopId);
      console.log("[seed] demo jobs 1073–1074 (extra work and the final bill) added");
    }
    if (!(await demoCalendarExists(db, shopId))) {
      await seedDemoCalendar(db, shopId);
      console.log("[seed] calendar resources (dyno, bays, lift, a mechanic) added");
    }
    if (!(await demoStockExists(db, shopId))) {
      await seedDemoStock(db, shopId);
      console.log("[seed] demo stock and jobs 1070–1071 added");
    }
  }
} finally {
  await db.destroy();
}
