import { readdirSync, statSync } from "node:fs";
import path from "node:path";
import type { RouteHandler } from "@/app/_server/route";
import { ROLES, rolesFor, type Role } from "@/lib/auth/roles";

// The app's route handlers as the tests that hold every one of them to a rule find them.

/** The repository's root. */
export const ROOT = path.resolve(import.meta.dirname, "../..");

/** Every app/api/**\/route.ts, as paths from the repository's root with "/" ("app/api/sync/route.ts"). */
export function routeFiles(dir = path.join(ROOT, "app/api")): string[] {
  return readdirSync(dir).flatMap((name) => {
    const full = path.join(dir, name);
    if (statSync(full).isDirectory()) return routeFiles(full);
    return name === "route.ts" ? [path.relative(ROOT, full).split(path.sep).join("/")] : [];
  });
}

/** The roles a handler lets through (every role for a public one or one open to anyone signed in). */
export function rolesAllowed(h: RouteHandler<unknown>): Role[] {
  const access = h.rule.access;
  if (!access) return [...ROLES];
  if ("signedIn" in access) return [...ROLES];
  const areas = "area" in access ? [access.area] : access.anyArea;
  return ROLES.filter((r) => areas.some((a) => rolesFor(a).includes(r)));
}
