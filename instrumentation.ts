// Runs once when the server starts, before it serves anything: a production start with missing or
// default secrets, or a public address that is not https, is refused with the reasons
// (lib/setup/production-settings.ts).
import { isProductionStart, productionSettingProblems, refusedStartMessage } from "@/lib/setup/production-settings";

export async function register(): Promise<void> {
  if (process.env.NEXT_RUNTIME !== "nodejs" || !isProductionStart(process.env)) return;
  const problems = productionSettingProblems(process.env);
  if (problems.length) {
    console.error(refusedStartMessage(problems));
    process.exit(1);
  }
}
