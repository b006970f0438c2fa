import { getServerSession } from "next-auth";
import { redirect } from "next/navigation";
import { NextResponse } from "next/server";
import { db } from "@/db/setup/client";
import { loadSessionUser } from "@/db/shop/users";
import { canReach, homePathFor, type Area } from "@/lib/auth/roles";
import type { SessionUser } from "@/lib/auth/session-user";
import { authOptions } from "./auth-options";

// The signed-in user, re-read from the database so a deactivated account or changed role
// takes effect at once. null when not signed in.
export async function currentUser(): Promise<SessionUser | null> {
  const session = await getServerSession(authOptions);
  const id = (session?.user as { id?: string } | undefined)?.id;
  if (!id) return null;
  return loadSessionUser(db(), id);
}

// For pages: the user when they may reach `area`; otherwise a redirect (sign-in, or their own home).
export async function requirePageArea(area: Area): Promise<SessionUser> {
  const user = await currentUser();
  if (!user) redirect("/signin");
  if (!canReach(user.role, area)) redirect(`${homePathFor(user.role)}?refused=${encodeURIComponent(area)}`);
  return user;
}

export type ApiAuth = { user: SessionUser; response?: undefined } | { user?: undefined; response: NextResponse };

// For route handlers: the user, or a 401/403 JSON response to return as it is. Never data.
export async function requireApiArea(area: Area): Promise<ApiAuth> {
  const user = await currentUser();
  if (!user) return { response: NextResponse.json({ error: "Sign in first." }, { status: 401 }) };
  if (!canReach(user.role, area)) {
    return { response: NextResponse.json({ error: `Your role (${user.role}) may not use this.` }, { status: 403 }) };
  }
  return { user };
}
