import { requireApiArea } from "@/app/_server/session";
import { db } from "@/db/setup/client";
import { jobSnapshotResponse } from "../../handlers";

// GET /api/bench/jobs/[id]: a full snapshot of one job for the tablet's store.
export async function GET(_request: Request, { params }: { params: Promise<{ id: string }> }): Promise<Response> {
  const auth = await requireApiArea("bench");
  if (auth.response) return auth.response;
  const { id } = await params;
  return jobSnapshotResponse(auth.user, db(), id);
}
