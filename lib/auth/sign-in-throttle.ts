// Sign-in waits: slowing down password guessing without letting anyone lock an account's owner out.
//
// Each attempt is counted in buckets (failures within the last hour, since the bucket's last
// success and since the office last cleared it):
//   - "pair": one account from one client address. After 3 failures each further try must wait
//     2 s, then 4, 8, … up to 5 minutes after the last failure. This is what stops a guesser on
//     one account; the owner, at another address, is not in this bucket.
//   - "address": one client address, any account (a spray over many accounts, or one account
//     with rotated X-Forwarded-For headers, which are not believed; lib/auth/client-address.ts).
//     After 10 failures: 2 s, 4 s, … up to 5 minutes.
//   - "account": one account from every address together. Never a refusal — only a pause of
//     1.5 s before the password is checked once it has 10 failures, so a guesser spread over many
//     addresses is slowed and the owner, with the right password, still gets in.
// A try made while a wait runs is refused without the password being checked, and is not counted.
// Why no lock: OWASP ASVS 4.0 2.2.1 asks for anti-automation "effective against credential
// stuffing, brute force and account lockout attacks". A hard lock per account (the old rule: the
// 6th failure locked the account, right password included, for 15 minutes) turns the defence into
// the attack: anyone who knows a mechanic's e-mail keeps them off the bench. Here no bucket the
// attacker can fill from elsewhere refuses the owner: the per-account bucket only pauses, and the
// refusing buckets are tied to the attacker's own address.

export interface WaitRule {
  /** Failures allowed before any wait. */
  free: number;
  /** The first wait, doubled after each further failure. */
  firstWaitS: number;
  capS: number;
}

export const SIGN_IN_WAITS = {
  windowMinutes: 60,
  pair: { free: 3, firstWaitS: 2, capS: 300 },
  address: { free: 10, firstWaitS: 2, capS: 300 },
  account: { free: 10, pauseMs: 1500 },
} as const satisfies { windowMinutes: number; pair: WaitRule; address: WaitRule; account: { free: number; pauseMs: number } };

export type BucketKind = "pair" | "address" | "account";

export function bucketKey(kind: BucketKind, parts: { email?: string; address?: string }): string {
  if (kind === "pair") return `pair:${parts.email}|${parts.address}`;
  if (kind === "address") return `address:${parts.address}`;
  return `account:${parts.email}`;
}

/** The three buckets a password tried for `email` from `address` counts in. */
export function signInKeys(email: string, address: string): { pair: string; address: string; account: string } {
  return {
    pair: bucketKey("pair", { email, address }),
    address: bucketKey("address", { address }),
    account: bucketKey("account", { email }),
  };
}

export function parseBucketKey(key: string): { kind: BucketKind; email: string | null; address: string | null } | null {
  const m = /^(pair|address|account):(.*)$/.exec(key);
  if (!m) return null;
  const kind = m[1] as BucketKind;
  if (kind === "pair") {
    const at = m[2].lastIndexOf("|");
    return { kind, email: m[2].slice(0, at), address: m[2].slice(at + 1) };
  }
  return kind === "address" ? { kind, email: null, address: m[2] } : { kind, email: m[2], address: null };
}

/** The wait after `failures` failures, in seconds (0: none). */
export function waitAfter(failures: number, rule: WaitRule): number {
  if (failures < rule.free) return 0;
  return Math.min(rule.capS, rule.firstWaitS * 2 ** Math.min(30, failures - rule.free));
}

/** Seconds still to wait, given the failures and how long ago the last one was. */
export function waitLeft(failures: number, secondsSinceLastFailure: number | null, rule: WaitRule): number {
  const wait = waitAfter(failures, rule);
  if (!wait || secondsSinceLastFailure === null) return 0;
  return Math.max(0, Math.ceil(wait - secondsSinceLastFailure));
}

export function waitMessage(seconds: number): string {
  const span = seconds >= 90 ? `${Math.ceil(seconds / 60)} minutes` : `${seconds} second${seconds === 1 ? "" : "s"}`;
  return `Too many wrong passwords from here. Wait ${span}, then try again.`;
}
