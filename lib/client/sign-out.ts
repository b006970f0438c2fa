/**
 * Signs out through next-auth's own endpoints (fetch its CSRF token, post the sign-out, go to the
 * sign-in page), as `signOut` from `next-auth/react` does — without that client library, which
 * would otherwise be ~12 kB (gzip) of every page's first load, the bench's included.
 */
export async function signOutTo(callbackUrl: string, fetchFn: typeof fetch = fetch): Promise<string> {
  const csrf = await fetchFn("/api/auth/csrf", { cache: "no-store" }).then((r) => r.json() as Promise<{ csrfToken?: string }>);
  const res = await fetchFn("/api/auth/signout", {
    method: "POST",
    headers: { "content-type": "application/x-www-form-urlencoded", "X-Auth-Return-Redirect": "1" },
    body: new URLSearchParams({ csrfToken: csrf.csrfToken ?? "", callbackUrl, json: "true" }),
  });
  if (!res.ok) throw new Error(`sign-out answered ${res.status}`);
  return callbackUrl;
}

/**
 * Work recorded on this tablet and not yet with the server, asked before signing out: the bench
 * registers how to count it while it is open (`whileBenchOpen`); elsewhere there is none.
 */
let countUnsent: (() => Promise<number>) | null = null;

export function whileBenchOpen(count: () => Promise<number>): () => void {
  countUnsent = count;
  return () => {
    if (countUnsent === count) countUnsent = null;
  };
}

/** How many entries and photos this tablet still holds for the server (0 off the bench, or if it cannot tell). */
export async function unsentOnThisTablet(): Promise<number> {
  return countUnsent ? countUnsent().catch(() => 0) : 0;
}
