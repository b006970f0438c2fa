import { requireApiArea } from "@/app/_server/session";
import { db } from "@/db/client";
import { handleSyncRequest } from "@/db/sync-http";

// POST /api/sync: a tablet's outbox batch in, outcomes and changes from elsewhere out.
// The format and rules are in lib/sync (README.md there); the work is in db/sync.ts.
export async function POST(request: Request): Promise<Response> {
  const auth = await requireApiArea("bench");
  if (auth.response) return auth.response;
  return handleSyncRequest(request, auth.user, db());
}
