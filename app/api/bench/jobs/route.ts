import { route } from "@/app/_server/route";
import { listBenchJobs } from "@/db/bench/jobs";

// GET /api/bench/jobs: the shop's jobs open for bench work, mine first.
export const GET = route({ access: { area: "bench" } }, async ({ user, db }) => ({ jobs: await listBenchJobs(db, user) }));
