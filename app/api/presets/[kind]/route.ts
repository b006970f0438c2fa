import { z } from "zod";
import { created, json, route } from "@/app/_server/route";
import { listPresets, savePreset } from "@/db/shop/presets";
import { canReach } from "@/lib/auth/roles";
import type { SessionUser } from "@/lib/auth/session-user";
import { CHECK_THE_FIELDS, Refusal } from "@/lib/errors";
import { checkPresetBody, PRESET_AREA, PRESET_KINDS, presetNameSchema, type PresetKind } from "@/lib/presets/preset-kinds";

// What the shop saved by name: dyno CSV column mappings (dyno area), compressor map outlines
// (engine numbers area). GET lists the newest of each name; POST saves one (a new entry).
function kindFor(user: SessionUser, raw: string): PresetKind {
  const kind = PRESET_KINDS.find((k) => k === raw);
  if (!kind) throw new Refusal("No such kind of saved entry.", 404);
  if (!canReach(user.role, PRESET_AREA[kind])) throw new Refusal(`Your role (${user.role}) may not use this.`, 403);
  return kind;
}

export const GET = route({ access: { anyArea: ["dyno", "calculators"] }, params: ["kind"] }, async ({ user, params, db }) => {
  const kind = kindFor(user, params.kind);
  return { presets: await listPresets(db, user.shopId, kind) };
});

export const POST = route(
  {
    access: { anyArea: ["dyno", "calculators"] },
    params: ["kind"],
    body: json(z.object({ name: presetNameSchema, body: z.unknown() })),
  },
  async ({ user, params, body, db }) => {
    const kind = kindFor(user, params.kind);
    const checked = checkPresetBody(kind, body.body);
    if (!checked.ok) throw new Refusal(CHECK_THE_FIELDS, 400, checked.issues);
    return created({ id: await savePreset(db, user, kind, body.name, checked.preset.body) });
  },
);
