import { route } from "@/app/_server/route";
import { runningClocks } from "@/db/bench/clocks";

// The shop's clocks still running (time at the bench), for the supervisor to close the forgotten ones.
export const GET = route({ access: { area: "review" } }, async ({ user, db }) => ({ clocks: await runningClocks(db, user.shopId) }));
