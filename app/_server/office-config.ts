import "server-only";
import { z } from "zod";

// Outside services of the office side, configured by env vars with local defaults that match
// tests/fakes/start-fakes.sh (maildev, s3rver, the fake payment service). Read per call, so tests
// and the e2e server can point the app elsewhere without a rebuild.
const configSchema = z.object({
  SMTP_URL: z.url().default("smtp://127.0.0.1:1025"),
  MAIL_FROM: z.string().min(3).default("Gannet Street Engine Works <workshop@gannet-street.test>"),
  S3_ENDPOINT: z.url().default("http://127.0.0.1:4569"),
  S3_BUCKET: z.string().min(3).default("benchtag"),
  S3_REGION: z.string().default("us-east-1"),
  S3_ACCESS_KEY_ID: z.string().default("S3RVER"),
  S3_SECRET_ACCESS_KEY: z.string().default("S3RVER"),
  STRIPE_API_BASE: z.url().default("http://127.0.0.1:12111"),
  STRIPE_SECRET_KEY: z.string().startsWith("sk_").default("sk_test_benchtag_local"),
  STRIPE_WEBHOOK_SECRET: z.string().startsWith("whsec_").default("whsec_benchtag_local"),
  // Test mode only: confirm deposits server-side with this test payment method (e.g. pm_card_visa).
  STRIPE_TEST_PAYMENT_METHOD: z.string().default("pm_card_visa"),
  NEXTAUTH_URL: z.url().default("http://localhost:3000"),
});

type OfficeConfig = z.output<typeof configSchema>;

export function officeConfig(env: Record<string, string | undefined> = process.env): OfficeConfig {
  const picked = Object.fromEntries(Object.keys(configSchema.shape).map((k) => [k, env[k] === "" ? undefined : env[k]]));
  const r = configSchema.safeParse(picked);
  if (!r.success) throw new Error(`Bad configuration: ${r.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`).join("; ")}`);
  return r.data;
}
