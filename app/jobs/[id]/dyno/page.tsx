import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { requirePageArea } from "@/app/_server/session";
import { AppFrame } from "@/app/ui/app-frame";
import { StatusBadge } from "@/app/ui/status-badge";
import { db } from "@/db/setup/client";
import { listWorkOrderBookings } from "@/db/calendar/bookings";
import { findDynoWorkOrder, listDynoRuns } from "@/db/records/dyno";
import { listTuneVersions } from "@/db/records/tunes";
import { listPresets } from "@/db/shop/presets";
import { canReach } from "@/lib/auth/roles";
import { countingRuns } from "@/lib/dyno/run-withdrawal";
import { isUuid } from "@/lib/ids";
import { DynoBookings } from "./_components/dyno-bookings";
import { DynoCellCautions } from "./_components/dyno-cell-cautions";
import { DynoWorkspace } from "./_components/dyno-workspace";
import { TuneVersions } from "./_components/tune-versions";
import { WithdrawnRuns, WithdrawRunForm } from "./_components/withdraw-run";

export const metadata: Metadata = { title: "Dyno runs" };

export default async function JobDynoPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requirePageArea("dyno");
  const { id } = await params;
  if (!isUuid(id)) notFound();
  const job = await findDynoWorkOrder(db(), user.shopId, id);
  if (!job) notFound();
  const [all, tunes, mappings, dynoBookings] = await Promise.all([
    listDynoRuns(db(), user.shopId, id),
    listTuneVersions(db(), user.shopId, id),
    listPresets(db(), user.shopId, "dyno-csv-mapping"),
    listWorkOrderBookings(db(), user.shopId, id, "dyno"),
  ]);
  const runs = countingRuns(all);
  const withdrawn = all.filter((r) => r.withdrawn !== null);
  const bikeName = `${job.make} ${job.model}`;
  return (
    <AppFrame user={user} current="/dyno">
      <div className="flex flex-wrap items-start justify-between gap-4">
        <div>
          <p className="text-lg">
            <Link href="/dyno" className="underline">
              Dyno
            </Link>{" "}
            › #{job.number}
          </p>
          <h1 className="text-3xl font-bold">{bikeName}</h1>
          <p className="mt-1 flex flex-wrap items-center gap-3 text-lg">
            <span className="font-mono">{job.tagCode}</span> · {job.title} <StatusBadge status={job.status} />
          </p>
        </div>
        <div className="flex flex-wrap gap-4">
          <Link
            href={`/jobs/${job.id}/numbers`}
            className="flex min-h-target items-center rounded-xl border-2 border-ink bg-white px-6 text-xl font-bold"
          >
            This build&apos;s numbers
          </Link>
          {canReach(user.role, "build-report") && (
            <a
              href={`/api/jobs/${job.id}/build-report`}
              download
              className="flex min-h-target items-center rounded-xl bg-signal px-6 text-xl font-bold text-ink"
              data-testid="download-report"
            >
              Download build report (PDF)
            </a>
          )}
        </div>
      </div>
      <div className="mt-6 flex flex-col gap-6">
        <DynoBookings bookings={dynoBookings} linkToPlan={canReach(user.role, "office")} />
        <DynoCellCautions />
        <TuneVersions workOrderId={job.id} tunes={tunes} />
      </div>
      <DynoWorkspace workOrderId={job.id} bikeName={bikeName} runs={runs} tunes={tunes} mappings={mappings} />
      <div className="mt-6 flex flex-col gap-6">
        {canReach(user.role, "dyno-withdraw") && <WithdrawRunForm workOrderId={job.id} runs={runs} />}
        <WithdrawnRuns runs={withdrawn} />
      </div>
    </AppFrame>
  );
}
