import "server-only";
import bcrypt from "bcryptjs";
import { appendAudit } from "@/db/audit/append";
import { endSessions } from "@/db/auth/sessions";
import { holdAddressForSignIn, recordSignInAttempt } from "@/db/auth/sign-in-waits";
import type { Db } from "@/db/setup/client";
import { lockPasswordOf, setPasswordHash } from "@/db/shop/users";
import { signInKeys, waitMessage } from "@/lib/auth/sign-in-throttle";
import { Refusal } from "@/lib/errors";
import { waitBeforeTrying } from "./sign-in";

// Anyone signed in changes their own password (ASVS 2.1.5, 2.1.6): the current password and the
// new one. A wrong current password counts as a wrong password at sign-in for that e-mail from
// that address (lib/auth/sign-in-throttle.ts), so a stolen session cannot guess it faster than the
// sign-in page allows, and is refused while a wait stands. Once changed, every other session of
// the user ends ('password-set'); the one that changed it stays. Every attempt is in the audit log.

export const WRONG_CURRENT = "Your current password is not right: nothing was changed.";

export async function changeOwnPassword(
  db: Db,
  who: { userId: string; sessionId: string | null },
  input: { current: string; password: string },
  client: { address: string; userAgent: string },
): Promise<{ sessionsEnded: number }> {
  const newHash = await bcrypt.hash(input.password, 10);
  const result = await db.transaction().execute(async (trx) => {
    await holdAddressForSignIn(trx, client.address);
    const user = await lockPasswordOf(trx, who.userId);
    if (!user || !user.active)
      return { ok: false as const, shopId: user?.shop_id ?? null, reason: "account turned off", message: "Your account is turned off." };
    const keys = signInKeys(user.email, client.address);
    const wait = await waitBeforeTrying(trx, keys);
    if (wait > 0) return { ok: false as const, shopId: user.shop_id, reason: `waiting ${wait} s`, message: waitMessage(wait) };
    if (!(await bcrypt.compare(input.current, user.password_hash))) {
      await recordSignInAttempt(trx, [keys.pair, keys.address, keys.account], false, user.shop_id);
      return { ok: false as const, shopId: user.shop_id, reason: "wrong current password", message: WRONG_CURRENT };
    }
    if (await bcrypt.compare(input.password, user.password_hash)) {
      return {
        ok: false as const,
        shopId: user.shop_id,
        reason: "new password is the current one",
        message: "The new password is the one you have now: choose another.",
      };
    }
    await setPasswordHash(trx, user.id, newHash);
    const sessionsEnded = await endSessions(
      trx,
      user.shop_id,
      { userId: user.id, exceptSessionId: who.sessionId },
      "password-set",
      user.id,
    );
    return { ok: true as const, shopId: user.shop_id, sessionsEnded };
  });
  await appendAudit(db, [
    {
      shopId: result.shopId,
      actorId: who.userId,
      action: "user.password-changed",
      entity: "user",
      entityId: who.userId,
      outcome: result.ok ? "accepted" : "refused",
      reason: result.ok ? null : result.reason,
      detail: { clientAddress: client.address, ...(result.ok ? { otherSessionsEnded: result.sessionsEnded } : {}) },
    },
  ]);
  if (!result.ok)
    throw new Refusal(
      result.message,
      result.reason === "account turned off" ? 403 : 400,
      result.reason === "wrong current password" ? [{ path: "current", message: WRONG_CURRENT }] : [],
    );
  return { sessionsEnded: result.sessionsEnded };
}
