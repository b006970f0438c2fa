import type { Metadata } from "next";
import { db } from "@/db/client";
import { listWorkOrders } from "@/db/work-orders";
import { requirePageArea } from "../_server/session";
import { AppFrame } from "../ui/app-frame";
import { StatusBadge } from "../ui/status-badge";

export const metadata: Metadata = { title: "Work orders" };

export default async function OfficePage() {
  const user = await requirePageArea("office");
  const orders = await listWorkOrders(db(), user.shopId);
  return (
    <AppFrame user={user} current="/office">
      <h1 className="text-3xl font-bold">Work orders</h1>
      <table className="mt-6 w-full border-collapse text-left text-lg">
        <thead>
          <tr className="border-b-2 border-steel-700">
            <th className="py-2 pr-4">No.</th>
            <th className="py-2 pr-4">Bike</th>
            <th className="py-2 pr-4">Customer</th>
            <th className="py-2 pr-4">Job</th>
            <th className="py-2 pr-4">Status</th>
            <th className="py-2 pr-4">Mechanic</th>
          </tr>
        </thead>
        <tbody>
          {orders.map((o) => (
            <tr key={o.id} className="border-b border-steel-300">
              <td className="py-2 pr-4 font-mono">{o.number}</td>
              <td className="py-2 pr-4">
                {o.make} {o.model} <span className="font-mono text-steel-700">{o.tagCode}</span>
              </td>
              <td className="py-2 pr-4">{o.customerName}</td>
              <td className="py-2 pr-4">{o.title}</td>
              <td className="py-2 pr-4">
                <StatusBadge status={o.status} />
              </td>
              <td className="py-2 pr-4">{o.mechanicName ?? "—"}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </AppFrame>
  );
}
