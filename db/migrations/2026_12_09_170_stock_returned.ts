import { sql, type Kysely } from "kysely";

// A part fitted at the bench and then withdrawn (recorded by mistake: the wrong serial, the wrong
// job, four instead of two) never left the shelf: what its fit drew is put back by a "returned"
// movement, pointing at the draw it undoes (releases_id, unique: a draw is put back once), with the
// withdrawal's reason. It adds the quantity back to the lot and, for what the draw took from the
// job's reservation, puts that back aside for the job.

export async function up(db: Kysely<unknown>): Promise<void> {
  await sql`
    ALTER TABLE stock_movements DROP CONSTRAINT stock_movements_kind_check;
    ALTER TABLE stock_movements ADD CONSTRAINT stock_movements_kind_check
      CHECK (kind IN ('received', 'reserved', 'released', 'drawn', 'returned'));
    ALTER TABLE stock_movements ADD CONSTRAINT stock_movements_returned_whole
      CHECK (kind <> 'returned' OR (releases_id IS NOT NULL AND part_fitted_id IS NOT NULL AND work_order_id IS NOT NULL AND reason IS NOT NULL));
  `.execute(db);
}

export async function down(db: Kysely<unknown>): Promise<void> {
  await sql`
    ALTER TABLE stock_movements DROP CONSTRAINT stock_movements_returned_whole;
    ALTER TABLE stock_movements DROP CONSTRAINT stock_movements_kind_check;
    ALTER TABLE stock_movements ADD CONSTRAINT stock_movements_kind_check
      CHECK (kind IN ('received', 'reserved', 'released', 'drawn'));
  `.execute(db);
}
