import "server-only";
import { listSignInBuckets } from "@/db/auth/sign-in-waits";
import type { Db } from "@/db/setup/client";
import { parseBucketKey, SIGN_IN_WAITS, waitLeft, type BucketKind } from "@/lib/auth/sign-in-throttle";

export interface SignInWaitRow {
  key: string;
  kind: BucketKind;
  email: string | null;
  address: string | null;
  failures: number;
  /** Seconds the next try from there must still wait (0: none). */
  waitSeconds: number;
  /** An account slowed by its failures from everywhere (a pause per try, never a refusal). */
  slowed: boolean;
}

/** The shop's sign-in waits as the office sees them (Sign-ins page, GET /api/office/sign-in-waits). */
export async function signInWaitRows(db: Db, shopId: string): Promise<SignInWaitRow[]> {
  const buckets = await listSignInBuckets(db, shopId);
  return buckets.flatMap((b) => {
    const parsed = parseBucketKey(b.key);
    if (!parsed) return [];
    const rule = parsed.kind === "account" ? null : SIGN_IN_WAITS[parsed.kind];
    return [
      {
        key: b.key,
        kind: parsed.kind,
        email: parsed.email,
        address: parsed.address,
        failures: b.failures,
        waitSeconds: rule ? waitLeft(b.failures, b.secondsSinceLastFailure, rule) : 0,
        slowed: parsed.kind === "account" && b.failures >= SIGN_IN_WAITS.account.free,
      },
    ];
  });
}
