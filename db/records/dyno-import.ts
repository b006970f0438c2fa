import "server-only";
import type { Kysely } from "kysely";
import { checkDynoRunBody, runIssues } from "@/lib/dyno";
import type { FieldIssue } from "@/lib/errors";
import { saveDynoRun } from "./dyno";
import type { Database } from "../schema";

type DynoImportResult = { ok: true; id: string } | { ok: false; status: 400; issues: FieldIssue[] } | { ok: false; status: 404 };

/**
 * Checks a new run (fields and curve, from the table or a CSV file) and stores it, or stores
 * nothing and returns every problem with its field, row and column.
 */
export async function importDynoRun(
  db: Kysely<Database>,
  shopId: string,
  workOrderId: string,
  userId: string,
  body: unknown,
): Promise<DynoImportResult> {
  const check = checkDynoRunBody(body);
  if (!check.ok) return { ok: false, status: 400, issues: runIssues(check) };
  const id = await saveDynoRun(db, shopId, workOrderId, userId, check.run);
  return id ? { ok: true, id } : { ok: false, status: 404 };
}
