import "server-only";
import type { NextAuthOptions } from "next-auth";
import CredentialsProvider from "next-auth/providers/credentials";
import { endSession } from "@/db/auth/sessions";
import { db } from "@/db/setup/client";
import { credentialsSchema } from "@/lib/auth/credentials";
import { isRole } from "@/lib/auth/roles";
import { SESSION_ABSOLUTE_S } from "@/lib/auth/session-lifetime";
import { requestClientAddress } from "./client-address";
import { signInWithPassword } from "./sign-in";

// next-auth with e-mail and password. The signed cookie (JWT) carries the user's id, role and the
// id of the server-side session (db/auth/sessions.ts), which every request checks: signing out
// ends that session on the server, so the old cookie is refused at once. The cookie itself lasts
// no longer than a session can (12 hours).
export const authOptions: NextAuthOptions = {
  session: { strategy: "jwt", maxAge: SESSION_ABSOLUTE_S },
  pages: { signIn: "/signin" },
  providers: [
    CredentialsProvider({
      name: "Benchtag",
      credentials: { email: { type: "email" }, password: { type: "password" } },
      async authorize(raw, req) {
        const parsed = credentialsSchema.safeParse(raw ?? {});
        if (!parsed.success) throw new Error(parsed.error.issues[0]?.message ?? "Check your e-mail and password");
        const headers = req?.headers as Record<string, unknown> | undefined;
        const userAgent = typeof headers?.["user-agent"] === "string" ? headers["user-agent"] : "";
        const user = await signInWithPassword(db(), parsed.data, { address: requestClientAddress(headers), userAgent });
        return { id: user.id, name: user.name, email: user.email, role: user.role, sessionId: user.sessionId };
      },
    }),
  ],
  callbacks: {
    async jwt({ token, user }) {
      if (user) {
        token.sub = user.id;
        const role = (user as { role?: unknown }).role;
        if (isRole(role)) token.role = role;
        token.sid = (user as { sessionId?: string }).sessionId;
      }
      return token;
    },
    async session({ session, token }) {
      if (session.user) {
        (session.user as { id?: string }).id = token.sub;
        (session.user as { role?: unknown }).role = token.role;
        (session.user as { sessionId?: unknown }).sessionId = token.sid;
      }
      return session;
    },
  },
  events: {
    async signOut({ token }) {
      const sid = (token as { sid?: unknown } | null)?.sid;
      if (typeof sid === "string") await endSession(db(), sid, "signed-out");
    },
  },
};
