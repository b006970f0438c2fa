import "server-only";
import { redirect } from "next/navigation";
import { userOfSession, type SessionLookup } from "@/db/auth/sessions";
import { db, type Db } from "@/db/setup/client";
import { isUuid } from "@/lib/ids";
import { canReach, homePathFor, type Area } from "@/lib/auth/roles";
import type { SessionUser } from "@/lib/auth/session-user";
import { signedInClaim } from "./signed-in";

/**
 * The signed-in user behind the request's cookie: its server-side session must be open (not
 * signed out, ended by the office, or lapsed) and the user active; the session's idle expiry
 * slides forward. `refused` says why not ("ended": by someone else; "expired": otherwise).
 */
export async function lookUpSession(d: Db = db()): Promise<SessionLookup> {
  const claim = await signedInClaim();
  if (!claim || !isUuid(claim.sessionId)) return { refused: "expired" };
  const found = await userOfSession(d, claim.sessionId);
  if ("user" in found && found.user.id !== claim.userId) return { refused: "expired" };
  return found;
}

// The signed-in user, re-read from the database so a deactivated account, an ended session or a
// changed role takes effect at once. null when not signed in.
export async function currentUser(): Promise<SessionUser | null> {
  const found = await lookUpSession();
  return "user" in found ? found.user : null;
}

// For pages: the user when they may reach `area`; otherwise a redirect (sign-in, or their own home).
// Route handlers check through the route wrapper (./route.ts) instead.
export async function requirePageArea(area: Area): Promise<SessionUser> {
  const user = await currentUser();
  if (!user) redirect("/signin");
  if (!canReach(user.role, area)) redirect(`${homePathFor(user.role)}?refused=${encodeURIComponent(area)}`);
  return user;
}
