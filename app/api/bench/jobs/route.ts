import { requireApiArea } from "@/app/_server/session";
import { db } from "@/db/setup/client";
import { benchJobsResponse } from "../handlers";

// GET /api/bench/jobs: the shop's jobs open for bench work, mine first.
export async function GET(): Promise<Response> {
  const auth = await requireApiArea("bench");
  if (auth.response) return auth.response;
  return benchJobsResponse(auth.user, db());
}
