import "server-only";
import { sql } from "kysely";

// Whether an entry stands: an entry withdrawn at the bench (a row in `withdrawals` naming its
// operation) stays on the record, marked, but counts for nothing. `column` is the reference of the
// entry's operation id in the query ("o.id", "p.operation_id", …). One definition for every reader.

/** The entry at `column` was not withdrawn. */
export const notWithdrawn = (column: string) =>
  sql<boolean>`NOT EXISTS (SELECT 1 FROM withdrawals wd WHERE wd.operation_id = ${sql.ref(column)})`;

/** The entry at `column` was withdrawn. */
export const isWithdrawn = (column: string) =>
  sql<boolean>`EXISTS (SELECT 1 FROM withdrawals wd WHERE wd.operation_id = ${sql.ref(column)})`;
