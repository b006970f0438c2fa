/**
 * What a production start of the server must have set, checked before it serves anything
 * (instrumentation.ts). A start counts as production when NODE_ENV is "production" and
 * BENCHTAG_LOCAL_DEMO is not "1" — the flag `npm start` and the browser tests' server set, because
 * they run the demo workshop against local fakes with the project's own defaults.
 *
 * Refused: a missing or default secret (the defaults are public: they are in this repository), a
 * session secret shorter than 32 characters, a public address that is not https (the session
 * cookie is only marked Secure, and HSTS only means something, over https), and a trusted-proxy
 * setting that is not a whole number.
 */

export const LOCAL_DEMO_FLAG = "BENCHTAG_LOCAL_DEMO";

/** Values that are in this repository, so nobody's secret. */
const PUBLIC_DEFAULTS: Record<string, readonly string[]> = {
  NEXTAUTH_SECRET: ["e2e-only-secret-not-for-production"],
  STRIPE_WEBHOOK_SECRET: ["whsec_benchtag_local"],
  STRIPE_SECRET_KEY: ["sk_test_benchtag_local"],
  S3_SECRET_ACCESS_KEY: ["S3RVER"],
};

export function isProductionStart(env: Record<string, string | undefined>): boolean {
  return env.NODE_ENV === "production" && env[LOCAL_DEMO_FLAG] !== "1";
}

/** Every problem with the settings of a production start, in plain words; empty when it may start. */
export function productionSettingProblems(env: Record<string, string | undefined>): string[] {
  const problems: string[] = [];
  for (const [name, defaults] of Object.entries(PUBLIC_DEFAULTS)) {
    const value = env[name]?.trim();
    if (!value) problems.push(`${name} is not set.`);
    else if (defaults.includes(value)) problems.push(`${name} is the local demo's value, which is public: set a secret of your own.`);
  }
  const session = env.NEXTAUTH_SECRET?.trim();
  if (session && session.length < 32)
    problems.push("NEXTAUTH_SECRET is shorter than 32 characters: make one with `openssl rand -base64 32`.");
  const url = env.NEXTAUTH_URL?.trim();
  if (!url) problems.push("NEXTAUTH_URL (the public https address) is not set.");
  else if (!/^https:\/\//i.test(url)) problems.push(`NEXTAUTH_URL is ${url}: the public address must be https.`);
  const hops = env.TRUSTED_PROXY_HOPS;
  if (hops !== undefined && hops !== "" && !/^\d{1,2}$/.test(hops))
    problems.push(`TRUSTED_PROXY_HOPS is "${hops}": give the number of proxies in front of the app (0, 1, 2…).`);
  return problems;
}

/** The message a refused production start prints. */
export function refusedStartMessage(problems: readonly string[]): string {
  return [
    "Benchtag refuses to start in production with these settings:",
    ...problems.map((p) => `  - ${p}`),
    `See README.md, "Production settings". (A local demo or test server sets ${LOCAL_DEMO_FLAG}=1.)`,
  ].join("\n");
}
