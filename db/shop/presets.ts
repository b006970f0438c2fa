import "server-only";
import type { Kysely } from "kysely";
import type { PresetKind } from "@/lib/presets/preset-kinds";
import type { Database } from "../schema";

// What a shop saved by name (lib/presets/preset-kinds.ts). Append-only: saving a name again adds a
// newer row; the newest row of each name is the one offered.

/** The newest entry of each name of `kind`, by name. */
export async function listPresets(db: Kysely<Database>, shopId: string, kind: PresetKind) {
  const rows = await db
    .selectFrom("shop_presets as p")
    .innerJoin("users as u", "u.id", "p.created_by")
    .select(["p.id", "p.name", "p.body", "u.name as savedBy", "p.created_at as savedAt"])
    .distinctOn("p.name")
    .where("p.shop_id", "=", shopId)
    .where("p.kind", "=", kind)
    .orderBy("p.name")
    .orderBy("p.created_at", "desc")
    .execute();
  return rows.map((r) => ({ id: r.id, name: r.name, body: r.body, savedBy: r.savedBy, savedAt: r.savedAt.toISOString() }));
}

/** Saves `body` (already checked) under `name`; returns the new entry's id. */
export async function savePreset(
  db: Kysely<Database>,
  user: { id: string; shopId: string },
  kind: PresetKind,
  name: string,
  body: unknown,
): Promise<string> {
  const { id } = await db
    .insertInto("shop_presets")
    .values({ shop_id: user.shopId, kind, name, body: JSON.stringify(body), created_by: user.id })
    .returning("id")
    .executeTakeFirstOrThrow();
  return id;
}
