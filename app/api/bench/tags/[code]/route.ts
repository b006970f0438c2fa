import { requireApiArea } from "@/app/_server/session";
import { db } from "@/db/setup/client";
import { tagLookupResponse } from "../../handlers";

// GET /api/bench/tags/[code]: the job open for bench work on the bike with this tag.
export async function GET(_request: Request, { params }: { params: Promise<{ code: string }> }): Promise<Response> {
  const auth = await requireApiArea("bench");
  if (auth.response) return auth.response;
  const { code } = await params;
  return tagLookupResponse(auth.user, db(), code);
}
