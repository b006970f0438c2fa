import { createDb } from "../client";
import { demoAftercareExists, seedDemoAftercare } from "../../seed/demo-aftercare";
import { demoLateWorkExists, seedDemoLateWork } from "../../seed/demo-late-work";
import { demoShopId, seedDemoShop } from "../../seed/demo-shop";

// Seeds the invented demo workshop once; a second run leaves existing data alone. A shop seeded
// before demo jobs 1030–1032 existed gets them (once) without anything else being touched.
const db = createDb(undefined, 1);
try {
  const shopId = await demoShopId(db);
  if (shopId === null) {
    await seedDemoShop(db);
    console.log("[seed] demo shop written");
  } else if (!(await demoLateWorkExists(db, shopId))) {
    await seedDemoLateWork(db, shopId);
    console.log("[seed] demo shop present; demo jobs 1030–1032 added");
  } else if (!(await demoAftercareExists(db, shopId))) {
    await seedDemoAftercare(db, shopId);
    console.log("[seed] demo shop present; demo jobs 1040–1041 (come-backs and reminders) added");
  } else {
    console.log("[seed] demo shop already present");
  }
} finally {
  await db.destroy();
}
