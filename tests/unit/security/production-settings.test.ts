import { describe, expect, it } from "vitest";
import { isProductionStart, productionSettingProblems, refusedStartMessage } from "@/lib/setup/production-settings";

const good = {
  NODE_ENV: "production",
  NEXTAUTH_SECRET: "q".repeat(44),
  NEXTAUTH_URL: "https://bench.example.test",
  STRIPE_WEBHOOK_SECRET: "whsec_real",
  STRIPE_SECRET_KEY: "sk_live_real",
  S3_SECRET_ACCESS_KEY: "real-key",
};

describe("a production start", () => {
  it("is NODE_ENV=production without the local demo flag", () => {
    expect(isProductionStart({ NODE_ENV: "production" })).toBe(true);
    expect(isProductionStart({ NODE_ENV: "production", BENCHTAG_LOCAL_DEMO: "1" })).toBe(false);
    expect(isProductionStart({ NODE_ENV: "development" })).toBe(false);
  });

  it("starts with real secrets and an https address", () => {
    expect(productionSettingProblems(good)).toEqual([]);
  });

  it("is refused with missing or default secrets, a short session secret, http, or a bad proxy count, each named", () => {
    const problems = productionSettingProblems({
      NODE_ENV: "production",
      NEXTAUTH_SECRET: "short",
      NEXTAUTH_URL: "http://bench.example.test",
      STRIPE_WEBHOOK_SECRET: "whsec_benchtag_local",
      TRUSTED_PROXY_HOPS: "yes",
    });
    expect(problems).toEqual([
      "STRIPE_WEBHOOK_SECRET is the local demo's value, which is public: set a secret of your own.",
      "STRIPE_SECRET_KEY is not set.",
      "S3_SECRET_ACCESS_KEY is not set.",
      "NEXTAUTH_SECRET is shorter than 32 characters: make one with `openssl rand -base64 32`.",
      "NEXTAUTH_URL is http://bench.example.test: the public address must be https.",
      'TRUSTED_PROXY_HOPS is "yes": give the number of proxies in front of the app (0, 1, 2…).',
    ]);
    expect(productionSettingProblems({ ...good, NEXTAUTH_SECRET: "e2e-only-secret-not-for-production" })).toEqual([
      "NEXTAUTH_SECRET is the local demo's value, which is public: set a secret of your own.",
    ]);
    expect(refusedStartMessage(["X is not set."])).toMatch(
      /refuses to start in production[\s\S]*- X is not set\.[\s\S]*BENCHTAG_LOCAL_DEMO=1/,
    );
  });
});
