import { after } from "next/server";
import { requireApiArea } from "@/app/_server/session";
import { deliverReviewNotices } from "@/app/_server/review-mail";
import { db } from "@/db/setup/client";
import { handleSyncRequest } from "@/db/sync/http";

// POST /api/sync: a tablet's outbox batch in, outcomes and changes from elsewhere out.
// The format and rules are in lib/sync (README.md there); the work is in db/sync/merge.ts.
// After a merge has committed, the supervisors' e-mail for new sign-offs is sent (the notices were
// stored by the merge itself; see db/review/notices.ts), outside the response's time.
export async function POST(request: Request): Promise<Response> {
  const auth = await requireApiArea("bench");
  if (auth.response) return auth.response;
  const response = await handleSyncRequest(request, auth.user, db());
  if (response.ok) after(() => deliverReviewNotices(db()).catch((e) => console.error("[review] notice e-mail run failed", e)));
  return response;
}
