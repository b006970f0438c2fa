import type { Metadata } from "next";
import Link from "next/link";
import { requirePageArea } from "../_server/session";
import { AppFrame } from "../ui/app-frame";
import { listLateJobs } from "@/db/calendar/promises";
import { db } from "@/db/setup/client";
import { LateJobs } from "./_components/late-jobs";
import { UnansweredMessages } from "./_components/unanswered-messages";
import { unansweredThreads } from "@/db/customer-contact/messages";
import { WorkOrdersTable } from "./_components/work-orders-table";
import { MoneyToGiveBack } from "./_components/money-to-give-back";
import { openGiveBacks } from "@/db/office/give-backs";
import { shopTimeZone } from "@/db/shop/settings";

export const metadata: Metadata = { title: "Work orders" };

export default async function OfficePage() {
  const user = await requirePageArea("office");
  const [late, unanswered, giveBacks, timeZone] = await Promise.all([
    listLateJobs(db(), user.shopId),
    unansweredThreads(db(), user.shopId),
    openGiveBacks(db(), user.shopId),
    shopTimeZone(db(), user.shopId),
  ]);
  return (
    <AppFrame user={user} current="/office">
      <div className="flex flex-wrap items-center gap-4">
        <h1 className="text-3xl font-bold">Work orders</h1>
        <Link
          href="/office/work-orders/new"
          className="ml-auto flex min-h-12 items-center rounded-lg bg-steel-900 px-5 text-lg font-bold text-white"
        >
          + Book a bike in
        </Link>
      </div>
      <UnansweredMessages threads={unanswered} />
      <MoneyToGiveBack rows={giveBacks} timeZone={timeZone} />
      <LateJobs jobs={late} />
      <WorkOrdersTable />
    </AppFrame>
  );
}
