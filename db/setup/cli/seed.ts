import { createDb } from "../client";
import { demoBenchTimeExists, seedDemoBenchTime } from "../../seed/demo-bench-time";
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
  } else {
    console.log("[seed] demo shop already present");
  }
  if (shopId !== null && !(await demoBenchTimeExists(db, shopId))) {
    await seedDemoBenchTime(db, shopId);
    console.log("[seed] demo jobs 1060–1061 (time at the bench) added");
  }
} finally {
  await db.destroy();
}
