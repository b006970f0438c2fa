import type { Metadata } from "next";
import Link from "next/link";
import { requirePageArea } from "@/app/_server/session";
import { AppFrame } from "@/app/ui/app-frame";
import { formatDay } from "@/lib/format/dates";
import { StatusBadge } from "@/app/ui/status-badge";
import { comeBacksByBatch, comeBacksByTemplate, listComeBacks } from "@/db/aftercare/come-backs";
import { db } from "@/db/setup/client";
import { CAUSE_LABELS } from "@/lib/aftercare/come-backs";

export const metadata: Metadata = { title: "Come-backs" };

// Every come-back, and the same grouped by the part batches and the procedure templates of the
// original jobs, so a bad batch or a weak procedure shows up.
export default async function ComeBacksPage() {
  const user = await requirePageArea("come-backs");
  const [all, byBatch, byTemplate] = await Promise.all([
    listComeBacks(db(), user.shopId),
    comeBacksByBatch(db(), user.shopId),
    comeBacksByTemplate(db(), user.shopId),
  ]);
  const th = "py-2 pr-4";
  return (
    <AppFrame user={user} current="/come-backs">
      <h1 className="text-3xl font-bold">Come-backs</h1>
      <p className="mt-2 max-w-3xl text-lg">
        A come-back is a bike back after handover with a fault. Open one from the bike&apos;s handed-over job (office) or by scanning its
        tag at the bench (supervisors).
      </p>
      <section className="mt-6" aria-labelledby="cb-all">
        <h2 id="cb-all" className="text-2xl font-bold">
          All come-backs
        </h2>
        {all.length ? (
          <table className="mt-2 w-full border-collapse text-left text-lg" data-testid="come-backs">
            <thead>
              <tr className="border-b-2 border-steel-700">
                <th className={th}>Come-back</th>
                <th className={th}>Of job</th>
                <th className={th}>Bike</th>
                <th className={th}>Opened</th>
                <th className={th}>Status</th>
                <th className={th}>Finding</th>
              </tr>
            </thead>
            <tbody>
              {all.map((c) => (
                <tr key={c.id} className="border-b border-steel-300" data-testid="come-back-row">
                  <td className={th}>
                    <Link className="font-mono underline" href={`/come-backs/${c.id}`}>
                      #{c.number}
                    </Link>
                  </td>
                  <td className={`${th} font-mono`}>#{c.originalNumber}</td>
                  <td className={th}>
                    {c.make} {c.model} · <span className="font-mono">{c.tagCode}</span>
                  </td>
                  <td className={th}>{formatDay(c.openedAt)}</td>
                  <td className={th}>
                    <StatusBadge status={c.status} />
                  </td>
                  <td className={th}>
                    {c.cause
                      ? `${CAUSE_LABELS[c.cause]}${c.underWarranty ? " · warranty" : ""}`
                      : c.warrantyClaimed
                        ? "none yet · warranty claimed"
                        : "none yet"}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        ) : (
          <p className="mt-2 text-lg">No come-backs.</p>
        )}
      </section>
      <div className="mt-8 grid gap-8 lg:grid-cols-2">
        <section aria-labelledby="cb-batch">
          <h2 id="cb-batch" className="text-2xl font-bold">
            By part batch
          </h2>
          <p className="text-base">Batches fitted on the original jobs; “fitted on” counts every job of the shop that got the batch.</p>
          {byBatch.length ? (
            <table className="mt-2 w-full border-collapse text-left text-lg" data-testid="by-batch">
              <thead>
                <tr className="border-b-2 border-steel-700">
                  <th className={th}>Part · batch</th>
                  <th className={th}>Come-backs</th>
                  <th className={th}>Fitted on</th>
                </tr>
              </thead>
              <tbody>
                {byBatch.map((b) => (
                  <tr key={`${b.partNumber}|${b.batch}`} className="border-b border-steel-300" data-testid="batch-row">
                    <td className={th}>
                      <span className="font-mono">{b.partNumber}</span> {b.description} · batch <span className="font-mono">{b.batch}</span>
                    </td>
                    <td className={th}>{b.comeBacks.map((n) => `#${n}`).join(", ")}</td>
                    <td className={th}>{b.fittedJobs} jobs</td>
                  </tr>
                ))}
              </tbody>
            </table>
          ) : (
            <p className="mt-2 text-lg">No batch on a come-back&apos;s original job.</p>
          )}
        </section>
        <section aria-labelledby="cb-template">
          <h2 id="cb-template" className="text-2xl font-bold">
            By procedure template
          </h2>
          <p className="text-base">Templates the original jobs ran; “handed over” counts every handed-over job that ran it.</p>
          {byTemplate.length ? (
            <table className="mt-2 w-full border-collapse text-left text-lg" data-testid="by-template">
              <thead>
                <tr className="border-b-2 border-steel-700">
                  <th className={th}>Template</th>
                  <th className={th}>Come-backs</th>
                  <th className={th}>Handed over</th>
                </tr>
              </thead>
              <tbody>
                {byTemplate.map((t) => (
                  <tr key={t.templateId} className="border-b border-steel-300" data-testid="template-row">
                    <td className={th}>{t.name}</td>
                    <td className={th}>{t.comeBacks.map((n) => `#${n}`).join(", ")}</td>
                    <td className={th}>{t.handedOverJobs} jobs</td>
                  </tr>
                ))}
              </tbody>
            </table>
          ) : (
            <p className="mt-2 text-lg">No template on a come-back&apos;s original job.</p>
          )}
        </section>
      </div>
    </AppFrame>
  );
}
