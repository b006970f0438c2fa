import { execFileSync } from "node:child_process";
import path from "node:path";

// Starts the local fakes (idempotent) and points this process's adapters at them.
export function useFakes() {
  const script = path.resolve(import.meta.dirname, "../../fakes/start-fakes.sh");
  execFileSync("bash", [script, "start"], { stdio: "inherit" });
  const ports = {
    smtp: Number(process.env.FAKE_SMTP_PORT ?? 1025),
    mailWeb: Number(process.env.FAKE_MAIL_WEB_PORT ?? 1080),
    s3: Number(process.env.FAKE_S3_PORT ?? 4569),
    payments: Number(process.env.FAKE_PAYMENTS_PORT ?? 12111),
  };
  process.env.SMTP_URL = `smtp://127.0.0.1:${ports.smtp}`;
  process.env.S3_ENDPOINT = `http://127.0.0.1:${ports.s3}`;
  process.env.STRIPE_API_BASE = `http://127.0.0.1:${ports.payments}`;
  process.env.STRIPE_SECRET_KEY = "sk_test_benchtag_local";
  process.env.STRIPE_WEBHOOK_SECRET = "whsec_benchtag_local";
  return ports;
}

export interface MaildevMessage {
  id: string;
  subject: string;
  to: Array<{ address: string }>;
  text?: string;
  attachments?: Array<{ fileName?: string; generatedFileName?: string; contentType: string; length?: number }>;
}

// Messages maildev holds for one recipient (REST API), waiting up to `ms` for at least `min`.
export async function mailTo(webPort: number, address: string, min = 1, ms = 5000): Promise<MaildevMessage[]> {
  const until = Date.now() + ms;
  for (;;) {
    const all = (await (await fetch(`http://127.0.0.1:${webPort}/api/email`)).json()) as MaildevMessage[];
    const mine = all.filter((m) => m.to.some((t) => t.address === address));
    if (mine.length >= min || Date.now() > until) return mine;
    await new Promise((r) => setTimeout(r, 100));
  }
}
