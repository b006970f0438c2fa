import "server-only";
import bcrypt from "bcryptjs";
import { appendAudit } from "@/db/audit/append";
import { startSession } from "@/db/auth/sessions";
import { bucketStates, holdAddressForSignIn, recordSignInAttempt } from "@/db/auth/sign-in-waits";
import type { Db } from "@/db/setup/client";
import { findUserForSignIn } from "@/db/shop/users";
import { isRole, type Role } from "@/lib/auth/roles";
import { signInKeys, SIGN_IN_WAITS, waitLeft, waitMessage, type WaitRule } from "@/lib/auth/sign-in-throttle";

// One sign-in attempt with e-mail and password, with the waits of lib/auth/sign-in-throttle.ts.
// Every attempt — success, wrong password, unknown e-mail, turned-off account, refused for a
// wait — goes to the audit log with the client address.

// A bcrypt hash of nothing anyone types, compared against when the e-mail is unknown,
// so a wrong e-mail takes as long as a wrong password.
const NO_USER_HASH = "$2b$10$ppz4pLnEs5lBg5kQVJ5w/O/Mn3XjJsEUhYKwfEPCBMJ4j4bakCpjq";
export const NO_MATCH = "That e-mail and password do not match an active account.";

export class SignInRefused extends Error {}

export interface SignedIn {
  id: string;
  name: string;
  email: string;
  role: Role;
  sessionId: string;
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** Seconds before a password for this e-mail may be tried from this address again: the longer of the pair's and the address's waits. */
export async function waitBeforeTrying(db: Db, keys: { pair: string; address: string }): Promise<number> {
  const states = await bucketStates(db, [keys.pair, keys.address]);
  const left = (key: string, rule: WaitRule) =>
    waitLeft(states.get(key)?.failures ?? 0, states.get(key)?.secondsSinceLastFailure ?? null, rule);
  return Math.max(left(keys.pair, SIGN_IN_WAITS.pair), left(keys.address, SIGN_IN_WAITS.address));
}

export async function signInWithPassword(
  db: Db,
  input: { email: string; password: string },
  client: { address: string; userAgent: string },
  opts: { pause?: (ms: number) => Promise<void> } = {},
): Promise<SignedIn> {
  const { email, password } = input;
  const { address } = client;
  const keys = signInKeys(email, address);
  // The account bucket only ever slows: a pause before anything else, never a refusal.
  const account = (await bucketStates(db, [keys.account])).get(keys.account);
  if (account && account.failures >= SIGN_IN_WAITS.account.free) await (opts.pause ?? sleep)(SIGN_IN_WAITS.account.pauseMs);

  // A refused attempt names the account tried (entity), not as its actor: it may not have been them.
  const audit = (shopId: string | null, userId: string | null, outcome: "accepted" | "refused", reason: string | null) =>
    appendAudit(db, [
      {
        shopId,
        actorId: outcome === "accepted" ? userId : null,
        action: "sign-in",
        entity: "user",
        entityId: userId,
        outcome,
        reason,
        detail: { email, clientAddress: address, userAgent: client.userAgent.slice(0, 200) },
      },
    ]);

  const result = await db.transaction().execute(async (trx) => {
    await holdAddressForSignIn(trx, address);
    const wait = await waitBeforeTrying(trx, keys);
    const user = await findUserForSignIn(trx, email);
    const shopId = user?.shop_id ?? null;
    if (wait > 0) return { ok: false as const, shopId, userId: user?.id ?? null, reason: `waiting ${wait} s`, message: waitMessage(wait) };
    const matches = await bcrypt.compare(password, user?.password_hash ?? NO_USER_HASH);
    if (!user || !matches || !user.active || !isRole(user.role)) {
      await recordSignInAttempt(trx, [keys.pair, keys.address, keys.account], false, shopId);
      const reason = !user ? "no account with this e-mail" : !matches ? "wrong password" : "account turned off";
      return { ok: false as const, shopId, userId: user?.id ?? null, reason, message: NO_MATCH };
    }
    await recordSignInAttempt(trx, [keys.pair, keys.account], true, shopId);
    const sessionId = await startSession(trx, { id: user.id, shopId: user.shop_id, role: user.role }, client);
    return { ok: true as const, user, sessionId };
  });
  if (!result.ok) {
    await audit(result.shopId, result.userId, "refused", result.reason);
    throw new SignInRefused(result.message);
  }
  const { user, sessionId } = result;
  await audit(user.shop_id, user.id, "accepted", null);
  return { id: user.id, name: user.name, email: user.email, role: user.role, sessionId };
}
