import "server-only";
import bcrypt from "bcryptjs";
import type { NextAuthOptions } from "next-auth";
import CredentialsProvider from "next-auth/providers/credentials";
import { appendAudit } from "@/db/audit/append";
import { db } from "@/db/setup/client";
import { findUserForSignIn, recentSignInFailures, recordSignInAttempt } from "@/db/shop/users";
import { credentialsSchema, SIGN_IN_LIMIT } from "@/lib/auth/credentials";
import { isRole } from "@/lib/auth/roles";

// A bcrypt hash of nothing anyone types, compared against when the e-mail is unknown,
// so a wrong e-mail takes as long as a wrong password.
const NO_USER_HASH = "$2b$10$ppz4pLnEs5lBg5kQVJ5w/O/Mn3XjJsEUhYKwfEPCBMJ4j4bakCpjq";

function clientAddress(headers: Record<string, unknown> | undefined): string {
  const fwd = headers?.["x-forwarded-for"];
  const first = typeof fwd === "string" ? fwd.split(",")[0]?.trim() : undefined;
  return first || (typeof headers?.["x-real-ip"] === "string" ? (headers["x-real-ip"] as string) : "unknown");
}

export const authOptions: NextAuthOptions = {
  session: { strategy: "jwt", maxAge: 12 * 3600 },
  pages: { signIn: "/signin" },
  providers: [
    CredentialsProvider({
      name: "Benchtag",
      credentials: { email: { type: "email" }, password: { type: "password" } },
      async authorize(raw, req) {
        const parsed = credentialsSchema.safeParse(raw ?? {});
        if (!parsed.success) throw new Error(parsed.error.issues[0]?.message ?? "Check your e-mail and password");
        const { email, password } = parsed.data;
        const keys = [`email:${email}`, `ip:${clientAddress(req?.headers as Record<string, unknown>)}`];
        const d = db();
        const [byEmail, byAddress] = await Promise.all(keys.map((k) => recentSignInFailures(d, k)));
        if (byEmail >= SIGN_IN_LIMIT.maxFailuresPerEmail || byAddress >= SIGN_IN_LIMIT.maxFailuresPerAddress) {
          await appendAudit(d, [
            { shopId: null, actorId: null, action: "sign-in", entity: "user", entityId: email, outcome: "refused", reason: "rate limited" },
          ]);
          throw new Error(`Too many failed sign-ins. Wait ${SIGN_IN_LIMIT.windowMinutes} minutes and try again.`);
        }
        const user = await findUserForSignIn(d, email);
        const ok = await bcrypt.compare(password, user?.password_hash ?? NO_USER_HASH);
        if (!user || !ok || !user.active) {
          await recordSignInAttempt(d, keys, false);
          throw new Error("That e-mail and password do not match an active account.");
        }
        await recordSignInAttempt(d, keys, true);
        await appendAudit(d, [
          { shopId: user.shop_id, actorId: user.id, action: "sign-in", entity: "user", entityId: user.id, outcome: "accepted" },
        ]);
        return { id: user.id, name: user.name, email: user.email, role: user.role };
      },
    }),
  ],
  callbacks: {
    async jwt({ token, user }) {
      if (user) {
        token.sub = user.id;
        const role = (user as { role?: unknown }).role;
        if (isRole(role)) token.role = role;
      }
      return token;
    },
    async session({ session, token }) {
      if (session.user) {
        (session.user as { id?: string }).id = token.sub;
        (session.user as { role?: unknown }).role = token.role;
      }
      return session;
    },
  },
};
