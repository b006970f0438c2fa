import { json, route } from "@/app/_server/route";
import { recordDiscards } from "@/db/sync/discards";
import { discardRequestSchema } from "@/lib/sync/discards";

// POST /api/sync/discards: a tablet discards entries the server refused (or holds), each with the
// person's reason. The server writes down what each was and why it goes (audit log,
// "sync.discarded"), marks a held one discarded, and answers per entry: discarded (let it go) or
// stored (the server holds it as recorded work: treat it as sent). Sending the same discard again
// is harmless. Rules and shapes: lib/sync/discards.ts, db/sync/discards.ts.
export const POST = route(
  { access: { area: "bench" }, body: json(discardRequestSchema, { maxBytes: 2 * 1024 * 1024, anyText: true }) },
  ({ user, body, db }) => recordDiscards(db, user, body),
);
