import "server-only";
import { redirect } from "next/navigation";
import { db } from "@/db/setup/client";
import { loadSessionUser } from "@/db/shop/users";
import { canReach, homePathFor, type Area } from "@/lib/auth/roles";
import type { SessionUser } from "@/lib/auth/session-user";
import { signedInUserId } from "./signed-in";

// The signed-in user, re-read from the database so a deactivated account or changed role
// takes effect at once. null when not signed in.
export async function currentUser(): Promise<SessionUser | null> {
  const id = await signedInUserId();
  return id ? loadSessionUser(db(), id) : null;
}

// For pages: the user when they may reach `area`; otherwise a redirect (sign-in, or their own home).
// Route handlers check through the route wrapper (./route.ts) instead.
export async function requirePageArea(area: Area): Promise<SessionUser> {
  const user = await currentUser();
  if (!user) redirect("/signin");
  if (!canReach(user.role, area)) redirect(`${homePathFor(user.role)}?refused=${encodeURIComponent(area)}`);
  return user;
}
