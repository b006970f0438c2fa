import "server-only";
import { getServerSession } from "next-auth";
import { authOptions } from "./auth-options";

/** What the signed session cookie names: the user and the server-side session. */
export interface SessionClaim {
  userId: string;
  sessionId: string;
}

/**
 * The claim in the signed session cookie, or null when nobody is signed in (the route wrapper and
 * the pages' check both start here). A cookie without a session id (made before server-side
 * sessions) names no session and counts as signed out.
 */
export async function signedInClaim(): Promise<SessionClaim | null> {
  const session = await getServerSession(authOptions);
  const user = session?.user as { id?: unknown; sessionId?: unknown } | undefined;
  return typeof user?.id === "string" && typeof user.sessionId === "string" ? { userId: user.id, sessionId: user.sessionId } : null;
}
