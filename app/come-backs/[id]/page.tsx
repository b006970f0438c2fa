import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { requirePageArea } from "@/app/_server/session";
import { AppFrame } from "@/app/ui/app-frame";
import { formatDay, formatDayTime } from "@/lib/format/dates";
import { StatusBadge } from "@/app/ui/status-badge";
import { comeBackView } from "@/db/aftercare/come-backs";
import { db } from "@/db/setup/client";
import { canReach } from "@/lib/auth/roles";
import { CAUSE_LABELS } from "@/lib/aftercare/come-backs";
import { isUuid } from "@/lib/ids";
import { FindingForm } from "../_components/finding-form";
import { SideBySide } from "../_components/side-by-side";

export const metadata: Metadata = { title: "Come-back" };

// One come-back: the rider's report, the findings on record, and the original job's build beside what is found now.
export default async function ComeBackPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requirePageArea("come-backs");
  const { id } = await params;
  if (!isUuid(id)) notFound();
  const v = await comeBackView(db(), user.shopId, id);
  if (!v) notFound();
  const { comeBack: c, original, now, findings } = v;
  const current = findings.find((f) => f.current) ?? null;
  const officeLinks = canReach(user.role, "office");
  const jobLink = (woId: string, n: number) =>
    officeLinks ? (
      <Link className="font-mono underline" href={`/office/work-orders/${woId}`}>
        #{n}
      </Link>
    ) : (
      <span className="font-mono">#{n}</span>
    );
  return (
    <AppFrame user={user} current="/come-backs">
      <p>
        <Link href="/come-backs" className="underline">
          ◀ Come-backs
        </Link>
      </p>
      <h1 className="mt-1 text-3xl font-bold">
        Come-back {jobLink(c.workOrderId, now.job.number)} of job {jobLink(c.originalId, original.job.number)}
      </h1>
      <p className="mt-2 flex flex-wrap items-center gap-3 text-lg">
        {now.job.make} {now.job.model} · <span className="font-mono">{now.job.tagCode}</span> · <StatusBadge status={now.job.status} />
        <span>
          original handed over {c.originalHandedOverAt ? formatDay(c.originalHandedOverAt) : "—"} · opened {formatDayTime(c.openedAt)} by{" "}
          {c.openedBy}
        </span>
      </p>
      <p className="mt-2 text-lg">
        <span className="font-bold">Rider reports:</span> <span className="whitespace-pre-wrap">{c.riderReport}</span>
      </p>
      <p className="mt-1 text-lg" data-testid="warranty-claimed">
        <span className="font-bold">Warranty:</span> {c.warrantyClaimed ? "⚑ claimed by the rider" : "○ not claimed"}
      </p>

      <section className="mt-6" aria-labelledby="sbs-heading">
        <h2 id="sbs-heading" className="text-2xl font-bold">
          The original build beside what is found now
        </h2>
        <p className="mb-4 text-lg">
          Left: job #{original.job.number} as handed over. Right: this come-back&apos;s own record (its readings, torque and parts as the
          bench records them).
        </p>
        <SideBySide original={original} now={now} />
      </section>

      <section className="mt-8 rounded-xl border-2 border-steel-300 bg-white p-4" aria-labelledby="findings-heading">
        <h2 id="findings-heading" className="text-2xl font-bold">
          Findings
        </h2>
        {findings.length ? (
          <ol className="mt-2 grid gap-2" data-testid="findings">
            {findings.map((f) => (
              <li
                key={f.id}
                className={`border-l-4 pl-3 ${f.current ? "border-steel-900" : "border-steel-300 text-steel-700"}`}
                data-testid="finding"
              >
                <p className="text-lg font-bold">
                  {f.current ? "▶ Current: " : "Replaced: "}
                  {CAUSE_LABELS[f.cause]} · {f.underWarranty ? "under warranty" : "charged"}
                </p>
                <p className="text-lg whitespace-pre-wrap">{f.note}</p>
                <p className="text-sm">
                  {f.recordedBy}, {formatDayTime(f.recordedAt)}
                </p>
              </li>
            ))}
          </ol>
        ) : (
          <p className="mt-2 text-lg">No finding recorded yet.</p>
        )}
        <div className="mt-4">
          <FindingForm comeBackId={c.id} replacesId={current?.id ?? null} />
        </div>
      </section>
    </AppFrame>
  );
}
