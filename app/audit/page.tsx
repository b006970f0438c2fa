import type { Metadata } from "next";
import { requirePageArea } from "../_server/session";
import { AppFrame } from "../ui/app-frame";
import { AuditTable } from "./_components/audit-table";

export const metadata: Metadata = { title: "Audit log" };

export default async function AuditPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const user = await requirePageArea("audit");
  const job = (await searchParams).job;
  return (
    <AppFrame user={user} current="/audit">
      <h1 className="text-3xl font-bold">Audit log</h1>
      <p className="mt-2 text-lg text-steel-700">
        Everything done in the shop — on the tablets, in review and in the office — accepted or refused, with why. Entries are never changed
        or removed.
      </p>
      <AuditTable initialJob={typeof job === "string" && /^\d{1,9}$/.test(job) ? job : ""} />
    </AppFrame>
  );
}
