import type { Metadata } from "next";
import Link from "next/link";
import { db } from "@/db/setup/client";
import { listDynoWorkOrders } from "@/db/records/dyno";
import { requirePageArea } from "../_server/session";
import { AppFrame } from "../ui/app-frame";
import { StatusBadge } from "../ui/status-badge";

export const metadata: Metadata = { title: "Dyno" };

// Work orders that can go on the dyno, with how many runs each has.
export default async function DynoJobsPage() {
  const user = await requirePageArea("dyno");
  const jobs = await listDynoWorkOrders(db(), user.shopId);
  return (
    <AppFrame user={user} current="/dyno">
      <h1 className="text-3xl font-bold">Dyno</h1>
      <p className="mt-2 text-lg">Pick a work order to record runs, compare curves and print the build report.</p>
      {jobs.length === 0 && <p className="mt-6 text-lg">No work orders on the bench or later yet.</p>}
      <ul className="mt-6 grid gap-4 md:grid-cols-2">
        {jobs.map((j) => (
          <li key={j.id}>
            <Link
              href={`/jobs/${j.id}/dyno`}
              className="flex min-h-target flex-col gap-2 rounded-xl border-2 border-steel-700 bg-white p-5 hover:bg-steel-50"
              data-testid="dyno-job"
            >
              <span className="text-2xl font-bold">
                {j.make} {j.model}
              </span>
              <span className="font-mono text-steel-700">
                #{j.number} · {j.tagCode}
              </span>
              <span className="text-lg">{j.title}</span>
              <span className="flex flex-wrap items-center gap-3 text-lg">
                <StatusBadge status={j.status} />
                <span>
                  {Number(j.runCount)} run{Number(j.runCount) === 1 ? "" : "s"}
                </span>
              </span>
            </Link>
          </li>
        ))}
      </ul>
    </AppFrame>
  );
}
