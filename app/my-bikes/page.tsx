import type { Metadata } from "next";
import type { BuildProgress } from "@/lib/work-orders/build-progress";
import { isBeingBuilt } from "@/lib/work-orders/status";
import { db } from "@/db/setup/client";
import { bikesOfCustomer } from "@/db/shop/bikes";
import { loadBuildProgress } from "@/db/records/build-progress";
import { quotesForCustomer } from "@/db/office/quotes";
import { reportRevisionsOf } from "@/db/records/report-revisions";
import { reviseAfterAcceptedChange } from "../_server/frozen-report";
import { CustomerQuote } from "./_components/customer-quote";
import { JobContact } from "./_components/job-contact";
import { threadOf } from "@/db/customer-contact/messages";
import { progressUpdatesOf } from "@/db/customer-contact/progress-updates";
import { CustomerBill } from "./_components/customer-bill";
import { ExtraWorkAnswers } from "../ui/extra-work-answers";
import { MoneyTotals } from "../ui/money-totals";
import { supplementsOf } from "@/db/office/supplements";
import { billInputOf, issuedBillOf } from "@/db/office/final-bill";
import { agreedTotal } from "@/lib/money/final-bill";
import { requirePageArea } from "../_server/session";
import { AppFrame } from "../ui/app-frame";
import { StatusBadge } from "../ui/status-badge";
import { formatDay } from "@/lib/format/dates";

export const metadata: Metadata = { title: "My bikes" };

export default async function MyBikesPage() {
  const user = await requirePageArea("my-bikes");
  const bikes = user.customerId ? await bikesOfCustomer(db(), user.shopId, user.customerId) : [];
  const quotes = user.customerId ? await quotesForCustomer(db(), user.shopId, user.customerId) : [];
  // the newest quote the customer may see, per work order
  const quoteOf = (workOrderId: string) => quotes.find((q) => q.workOrderId === workOrderId && q.status !== "superseded");
  // how far the build has got, for jobs on the bench or in review (the bikes above are the customer's own)
  const building = bikes.flatMap((b) => b.workOrders).filter((w) => isBeingBuilt(w.status));
  const progress = new Map(await Promise.all(building.map(async (w) => [w.id, await loadBuildProgress(db(), user, w.id)] as const)));
  // the stored copies of the report of every job handed over (brought up to date first)
  const handedOver = bikes.flatMap((b) => b.workOrders).filter((w) => w.status === "handed_over");
  const copies = new Map(
    await Promise.all(
      handedOver.map(async (w) => {
        await reviseAfterAcceptedChange(db(), user.shopId, w.id, null);
        return [w.id, await reportRevisionsOf(db(), user.shopId, w.id)] as const;
      }),
    ),
  );
  // what the workshop shared, and each job's thread (the jobs are the customer's own)
  const jobIds = bikes.flatMap((b) => b.workOrders).map((w) => w.id);
  const updates = await progressUpdatesOf(db(), user.shopId, jobIds);
  const threads = new Map(await Promise.all(jobIds.map(async (id) => [id, await threadOf(db(), user.shopId, id)] as const)));
  // extra work, the total agreed so far and the issued bill, per work order
  const allJobs = bikes.flatMap((b) => b.workOrders);
  const supplements = await supplementsOf(
    db(),
    allJobs.map((w) => w.id),
  );
  const money = new Map(
    await Promise.all(
      allJobs.map(async (w) => {
        const [source, bill] = await Promise.all([billInputOf(db(), user.shopId, w.id), issuedBillOf(db(), user.shopId, w.id)]);
        return [w.id, { source, bill }] as const;
      }),
    ),
  );
  const wire = <T,>(v: T) => JSON.parse(JSON.stringify(v));
  return (
    <AppFrame user={user} current="/my-bikes">
      <h1 className="text-3xl font-bold">My bikes</h1>
      {bikes.length === 0 && <p className="mt-4 text-lg">No bikes on record yet.</p>}
      {/* one bike per row: a bill's amounts need the full width of a tablet held upright */}
      <ul className="mt-6 grid gap-4">
        {bikes.map((b) => (
          <li key={b.id} className="rounded-xl border-2 border-steel-700 bg-white p-5" data-testid="my-bike">
            <h2 className="text-2xl font-bold">
              {b.make} {b.model} {b.year ? `(${b.year})` : ""}
            </h2>
            <p className="font-mono text-steel-700">Tag {b.tagCode}</p>
            <ul className="mt-3 space-y-2">
              {b.workOrders.map((w) => (
                <li key={w.id} className="text-lg" data-testid="my-work-order">
                  <div className="flex flex-wrap items-center gap-3">
                    <span className="font-mono">#{w.number}</span> {w.title} <StatusBadge status={w.status} />
                    <a
                      href={`/api/jobs/${w.id}/build-report`}
                      download
                      className="flex min-h-12 items-center rounded-lg border-2 border-ink px-3 text-base font-bold"
                      data-testid="my-build-report"
                    >
                      Build report (PDF)
                    </a>
                  </div>
                  <BuildLine progress={progress.get(w.id) ?? null} />
                  <StoredCopies workOrderId={w.id} copies={copies.get(w.id) ?? []} />
                  {quoteOf(w.id) && <CustomerQuote quote={quoteOf(w.id)!} />}
                  {supplements
                    .filter((s) => s.workOrderId === w.id)
                    .map((s) => (
                      <ExtraWorkAnswers
                        key={s.id}
                        supplement={wire(s)}
                        currency={s.currency}
                        photoBase="/api/my-bikes/extra-work-photos/"
                        submit={{ url: `/api/my-bikes/supplements/${s.id}/answers` }}
                      />
                    ))}
                  <AgreedTotal money={money.get(w.id)} hasExtraWork={supplements.some((s) => s.workOrderId === w.id)} />
                  {money.get(w.id)?.bill && <CustomerBill bill={wire(money.get(w.id)!.bill)} />}
                  <JobContact
                    workOrderId={w.id}
                    updates={updates.filter((u) => u.workOrderId === w.id)}
                    messages={threads.get(w.id) ?? []}
                  />
                </li>
              ))}
            </ul>
          </li>
        ))}
      </ul>
    </AppFrame>
  );
}

/** How far a build on the bench has got, in the customer's words; nothing when no steps are pinned. */
function BuildLine({ progress }: { progress: BuildProgress | null }) {
  if (!progress || progress.stepsTotal === 0) return null;
  return (
    <p className="mt-1 text-base" data-testid="my-build-progress">
      Build: {progress.stepsDone} of {progress.stepsTotal} steps done · {progress.approvedStages} of {progress.stages.length} stages checked
      by the workshop supervisor
    </p>
  );
}

/** Every stored copy of a handed-over job's report: which one was handed over, and what each later one changed. */
function StoredCopies({ workOrderId, copies }: { workOrderId: string; copies: Awaited<ReturnType<typeof reportRevisionsOf>> }) {
  if (copies.length === 0) return null;
  return (
    <div className="mt-2 rounded-lg border-2 border-steel-300 p-3" data-testid="my-report-copies">
      <p className="text-base font-bold">The build report as handed over, and every revision since</p>
      <ol className="mt-1 space-y-2">
        {copies.map((c) => (
          <li key={c.revision} className="text-base" data-testid="my-report-copy">
            <a
              href={`/api/jobs/${workOrderId}/build-report?revision=${c.revision}`}
              download
              className="inline-flex min-h-12 items-center rounded-lg border-2 border-ink px-3 font-bold"
            >
              Revision {c.revision} (PDF)
            </a>{" "}
            {c.handedOver ? (
              <span className="font-bold">✔ the one handed over, {formatDay(c.madeAt)}</span>
            ) : (
              <span>{formatDay(c.madeAt)}</span>
            )}
            {c.changes.length > 0 && (
              <ul className="ml-4 list-disc text-sm">
                {c.changes.map((x, i) => (
                  <li key={i}>{x}</li>
                ))}
              </ul>
            )}
            <span className="block break-all font-mono text-sm text-steel-700">SHA-256 {c.sha256}</span>
          </li>
        ))}
      </ol>
    </div>
  );
}

/** The job's total as agreed: the approved quote and the approved extra work, with tax (shown once there is extra work). */
function AgreedTotal({
  money,
  hasExtraWork,
}: {
  money: { source: Awaited<ReturnType<typeof billInputOf>>; bill: unknown } | undefined;
  hasExtraWork: boolean;
}) {
  if (!money?.source || money.bill || !hasExtraWork) return null;
  const t = agreedTotal(money.source.input.lines, money.source.input.taxRateBp);
  return (
    <div className="mt-2" data-testid="agreed-total">
      <p className="text-base font-bold">The job so far: your approved quote and the extra work you approved</p>
      <MoneyTotals
        currency={money.source.currency}
        rows={[
          { label: "Subtotal", minor: t.subtotalMinor },
          { label: "Tax", minor: t.taxMinor },
          { label: "Job total", minor: t.totalMinor, strong: true, testId: "agreed-total-figure" },
        ]}
      />
    </div>
  );
}
