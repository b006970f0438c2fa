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

export const metadata: Metadata = { title: "Work orders" };

export default async function OfficePage() {
  const user = await requirePageArea("office");
  const [late, unanswered] = await Promise.all([listLateJobs(db(), user.shopId), unansweredThreads(db(), user.shopId)]);
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
      <LateJobs jobs={late} />
      <WorkOrdersTable />
    </AppFrame>
  );
}
