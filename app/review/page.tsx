import type { Metadata } from "next";
import { db } from "@/db/client";
import { listWorkOrders } from "@/db/work-orders";
import { requirePageArea } from "../_server/session";
import { AppFrame } from "../ui/app-frame";
import { StatusBadge } from "../ui/status-badge";

export const metadata: Metadata = { title: "Review" };

export default async function ReviewPage() {
  const user = await requirePageArea("review");
  const orders = (await listWorkOrders(db(), user.shopId)).filter((o) => ["in_build", "in_review", "on_dyno"].includes(o.status));
  return (
    <AppFrame user={user} current="/review">
      <h1 className="text-3xl font-bold">Review</h1>
      <p className="mt-2 text-lg text-steel-700">Jobs with bench work under way.</p>
      <ul className="mt-6 space-y-3">
        {orders.map((o) => (
          <li key={o.id} className="flex flex-wrap items-center gap-3 rounded-lg border-2 border-steel-300 bg-white p-4 text-lg">
            <span className="font-mono">#{o.number}</span>
            <span className="font-bold">
              {o.make} {o.model}
            </span>
            <span>{o.title}</span>
            <StatusBadge status={o.status} />
            <span className="ml-auto">{o.mechanicName ?? "unassigned"}</span>
          </li>
        ))}
      </ul>
    </AppFrame>
  );
}
