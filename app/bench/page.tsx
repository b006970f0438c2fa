import type { Metadata } from "next";
import { db } from "@/db/client";
import { listWorkOrders } from "@/db/work-orders";
import { isOpenForBenchWork, type WorkOrderStatus } from "@/lib/work-orders/status";
import { requirePageArea } from "../_server/session";
import { AppFrame } from "../ui/app-frame";

export const metadata: Metadata = { title: "Bench" };

export default async function BenchPage() {
  const user = await requirePageArea("bench");
  const orders = (await listWorkOrders(db(), user.shopId)).filter((o) => isOpenForBenchWork(o.status as WorkOrderStatus));
  return (
    <AppFrame user={user} current="/bench">
      <h1 className="text-3xl font-bold">Bench</h1>
      <ul className="mt-6 grid gap-4 md:grid-cols-2">
        {orders.map((o) => (
          <li key={o.id} className="rounded-xl border-2 border-steel-700 bg-white p-5 text-xl">
            <p className="font-mono text-steel-700">
              #{o.number} · {o.tagCode}
            </p>
            <p className="font-bold">
              {o.make} {o.model}
            </p>
            <p>{o.title}</p>
          </li>
        ))}
      </ul>
    </AppFrame>
  );
}
