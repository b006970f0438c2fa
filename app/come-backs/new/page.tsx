import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { requirePageArea } from "@/app/_server/session";
import { AppFrame } from "@/app/ui/app-frame";
import { formatDay } from "@/lib/format/dates";
import { StatusBadge } from "@/app/ui/status-badge";
import { handedOverJobOfBike } from "@/db/aftercare/come-backs";
import { db } from "@/db/setup/client";
import { workOrderDetail } from "@/db/shop/work-orders";
import { isUuid } from "@/lib/ids";
import { OpenComeBackForm } from "../_components/open-form";

export const metadata: Metadata = { title: "Open a come-back" };

// Opening a come-back from a handed-over job (linked from the bench's scan and the office's work order).
export default async function NewComeBackPage({ searchParams }: { searchParams: Promise<{ original?: string }> }) {
  const user = await requirePageArea("come-backs");
  const { original } = await searchParams;
  if (!original || !isUuid(original)) notFound();
  const wo = await workOrderDetail(db(), user.shopId, original);
  if (!wo) notFound();
  const last = await handedOverJobOfBike(db(), user.shopId, wo.bikeId);
  return (
    <AppFrame user={user} current="/come-backs">
      <h1 className="text-3xl font-bold">Open a come-back</h1>
      <p className="mt-2 flex flex-wrap items-center gap-3 text-lg">
        Job <span className="font-mono">#{wo.number}</span> {wo.title} · {wo.make} {wo.model} ·{" "}
        <span className="font-mono">{wo.tagCode}</span> <StatusBadge status={wo.status} />
        {last?.workOrderId === wo.id && last.handedOverOn && <span>handed over {formatDay(last.handedOverOn)}</span>}
      </p>
      {wo.status !== "handed_over" ? (
        <p role="alert" className="mt-4 text-lg font-bold text-fail">
          ✖ Job #{wo.number} has not been handed over: a come-back is opened only for a bike that has been handed over.
        </p>
      ) : last?.workOrderId === wo.id && last.openComeBack ? (
        <p role="alert" className="mt-4 text-lg font-bold text-warn">
          ⚠ Come-back #{last.openComeBack.number} is already open for this job:{" "}
          <Link className="underline" href={`/come-backs/${last.openComeBack.id}`}>
            carry on with it
          </Link>
          .
        </p>
      ) : (
        <div className="mt-6">
          <OpenComeBackForm originalWorkOrderId={wo.id} originalNumber={wo.number} />
        </div>
      )}
    </AppFrame>
  );
}
