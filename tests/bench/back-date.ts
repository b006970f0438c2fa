// Spreads a generated shop's audit entries over the SPREAD_DAYS (364) days before now, oldest first (so a year's
// download, today and the 364 days before it, holds them all), for the audit
// CSV's date range to have something to cut: the app's writers stamp every entry with the time it is
// written, so a log generated in one run is all dated today. The entries themselves are the app's
// own (its merge, its review, its audit writer); only their times move. The log is append-only by
// trigger: the trigger is switched off inside this one transaction and back on before it commits.
import { sql, type Kysely } from "kysely";
import type { Database } from "@/db/schema";

/** How far back the entries go: a year's download is today and the 364 days before it. */
export const SPREAD_DAYS = 364;

export async function spreadAuditOverYear(db: Kysely<Database>, shopId: string): Promise<void> {
  await db.transaction().execute(async (trx) => {
    await sql`ALTER TABLE audit_log DISABLE TRIGGER audit_log_append_only`.execute(trx);
    await sql`
      UPDATE audit_log a
         SET at = now() - make_interval(secs => ${SPREAD_DAYS * 86_400} * (1 - r.k::float8 / r.n))
        FROM (SELECT id, row_number() OVER (ORDER BY id) AS k, count(*) OVER () AS n
                FROM audit_log WHERE shop_id = ${shopId}) r
       WHERE a.id = r.id`.execute(trx);
    await sql`ALTER TABLE audit_log ENABLE TRIGGER audit_log_append_only`.execute(trx);
  });
  await sql`ANALYZE audit_log`.execute(db);
}

/** The first day of the year's download (the audit range allows at most a year, today included), "YYYY-MM-DD". */
export function yearAgoDay(today = new Date()): string {
  return new Date(today.getTime() - SPREAD_DAYS * 86_400_000).toISOString().slice(0, 10);
}
