import type { Kysely } from "kysely";
import { z } from "zod";
import { findJobByTag, getJobSnapshot, listBenchJobs } from "@/db/bench/jobs";
import type { Database } from "@/db/schema";
import { canReach } from "@/lib/auth/roles";
import type { SessionUser } from "@/lib/auth/session-user";

// The bench read endpoints without next-auth: each route passes the signed-in user (or null);
// tests call these with their own. Each checks the role again and scopes to the user's shop.

const json = (body: unknown, status = 200) => Response.json(body, { status, headers: { "cache-control": "no-store" } });

function refuse(user: SessionUser | null): Response | null {
  if (!user) return json({ error: "Sign in first." }, 401);
  if (!canReach(user.role, "bench")) return json({ error: `Your role (${user.role}) may not use this.` }, 403);
  return null;
}

/** GET /api/bench/jobs */
export async function benchJobsResponse(user: SessionUser | null, db: Kysely<Database>): Promise<Response> {
  const no = refuse(user);
  if (no) return no;
  return json({ jobs: await listBenchJobs(db, user!) });
}

const jobIdSchema = z.uuid();

/** GET /api/bench/jobs/[id] */
export async function jobSnapshotResponse(user: SessionUser | null, db: Kysely<Database>, id: string): Promise<Response> {
  const no = refuse(user);
  if (no) return no;
  if (!jobIdSchema.safeParse(id).success) return json({ error: `"${id}" is not a work order id (a UUID).` }, 400);
  const snapshot = await getJobSnapshot(db, user!, id);
  if (!snapshot) return json({ error: `No work order ${id} in this shop.` }, 404);
  return json(snapshot);
}

const tagSchema = z
  .string()
  .trim()
  .min(1, "is empty")
  .max(64, "is longer than 64 characters")
  .regex(/^[\p{L}\p{N}._:/ -]+$/u, "may hold letters, digits, spaces and . _ : / - only");

/** GET /api/bench/tags/[code] */
export async function tagLookupResponse(user: SessionUser | null, db: Kysely<Database>, code: string): Promise<Response> {
  const no = refuse(user);
  if (no) return no;
  const tag = tagSchema.safeParse(code);
  if (!tag.success) return json({ error: `The tag code ${tag.error.issues[0].message}.` }, 400);
  const found = await findJobByTag(db, user!, tag.data);
  if (found.found === "nothing") return json({ error: `No bike with tag ${tag.data} in this shop.` }, 404);
  if (found.found === "bike-without-job") return json({ error: `Bike ${found.tagCode} has no open job.` }, 404);
  return json(found.job);
}
