import "server-only";
import { getServerSession } from "next-auth";
import { authOptions } from "./auth-options";

/** The id in the signed session cookie, or null when nobody is signed in (the route wrapper and the pages' check both start here). */
export async function signedInUserId(): Promise<string | null> {
  const session = await getServerSession(authOptions);
  return (session?.user as { id?: string } | undefined)?.id ?? null;
}
