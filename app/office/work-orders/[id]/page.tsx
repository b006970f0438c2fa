import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { requirePageArea } from "@/app/_server/session";
import { AppFrame } from "@/app/ui/app-frame";
import { listWorkOrderBookings } from "@/db/calendar/bookings";
import { promiseOfWorkOrder } from "@/db/calendar/promises";
import { db } from "@/db/setup/client";
import { dayLabel } from "@/lib/aftercare/reminders";
import { weekStart } from "@/lib/calendar/rules";
import { formatDayTime } from "@/lib/format/dates";
import { shopSettings } from "@/db/shop/settings";
import { workOrderInShop } from "@/db/shop/work-orders";
import { isUuid } from "@/lib/ids";
import { billPageData } from "@/db/office/final-bill";
import { BILL_STATUSES, EXTRA_WORK_STATUSES, mayIssueBill, mayWriteExtraWork } from "@/lib/office/extra-work";
import { STATUS_LABELS } from "@/lib/work-orders/status";
import { BillPanel } from "./_components/bill-panel";
import { ExtraWorkPanel } from "./_components/extra-work-panel";
import { PromisePanel } from "./_components/promise-panel";
import { CustomerContactPanel } from "./_components/customer-contact-panel";
import { threadOf } from "@/db/customer-contact/messages";
import { progressUpdatesOf, shareablePhotos } from "@/db/customer-contact/progress-updates";
import { WorkOrderView } from "./_components/work-order-view";

export const metadata: Metadata = { title: "Work order" };

export default async function WorkOrderPage({
  params,
  searchParams,
}: {
  params: Promise<{ id: string }>;
  searchParams: Promise<{ warning?: string }>;
}) {
  const user = await requirePageArea("office");
  const { id } = await params;
  if (!isUuid(id) || !(await workOrderInShop(db(), user.shopId, id))) notFound();
  const shop = await shopSettings(db(), user.shopId);
  const { warning } = await searchParams;
  const [{ closed, promised }, bookings, messages, updates, photos, bill] = await Promise.all([
    promiseOfWorkOrder(db(), user.shopId, id),
    listWorkOrderBookings(db(), user.shopId, id),
    threadOf(db(), user.shopId, id),
    progressUpdatesOf(db(), user.shopId, [id]),
    shareablePhotos(db(), user.shopId, id),
    billPageData(db(), user.shopId, id),
  ]);
  const labels = (s: readonly (keyof typeof STATUS_LABELS)[]) => s.map((x) => STATUS_LABELS[x].toLowerCase()).join(", ");
  return (
    <AppFrame user={user} current="/office">
      <PromisePanel
        workOrderId={id}
        closed={closed}
        promised={promised && { label: dayLabel(promised.promisedOn), setBy: promised.setBy, setAt: formatDayTime(promised.setAt) }}
        bookings={bookings.map((b) => ({
          id: b.id,
          text: `${b.resourceName}: ${dayLabel(b.day)}, ${b.from}–${b.to}`,
          href: `/office/calendar?resource=${b.resourceId}&week=${weekStart(b.day)}`,
        }))}
      />
      <WorkOrderView id={id} currency={shop.currency} taxRateBp={shop.taxRateBp} warning={warning?.slice(0, 300)} />
      {bill && (bill.source || bill.supplements.length > 0) && (
        <>
          <ExtraWorkPanel
            workOrderId={id}
            mayWrite={mayWriteExtraWork(bill.status) && !bill.issued && Boolean(bill.source)}
            why={
              bill.issued
                ? "The bill is issued: no more extra work on this job."
                : `Extra work is written while the job is ${labels(EXTRA_WORK_STATUSES)}, on an approved quote.`
            }
            supplements={JSON.parse(JSON.stringify(bill.supplements))}
            photos={bill.photos}
            currency={shop.currency}
          />
          <BillPanel
            workOrderId={id}
            source={bill.source && JSON.parse(JSON.stringify(bill.source))}
            issued={bill.issued && JSON.parse(JSON.stringify(bill.issued))}
            mayIssue={mayIssueBill(bill.status)}
            why={`The bill is issued while the job is ${labels(BILL_STATUSES)}; handover issues it if nobody did.`}
          />
        </>
      )}
      <CustomerContactPanel workOrderId={id} messages={messages} updates={updates} photos={photos} />
    </AppFrame>
  );
}
