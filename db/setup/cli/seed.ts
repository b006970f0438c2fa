import { createDb } from "../client";
import { demoShopExists, seedDemoShop } from "../../seed/demo-shop";

// Seeds the invented demo workshop once; a second run leaves existing data alone.
const db = createDb(undefined, 1);
try {
  if (await demoShopExists(db)) {
    console.log("[seed] demo shop already present");
  } else {
    await seedDemoShop(db);
    console.log("[seed] demo shop written");
  }
} finally {
  await db.destroy();
}
