import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { requirePageArea } from "@/app/_server/session";
import { AppFrame } from "@/app/ui/app-frame";
import { db } from "@/db/setup/client";
import { shopSettings } from "@/db/shop/settings";
import { workOrderInShop } from "@/db/shop/work-orders";
import { isUuid } from "@/lib/ids";
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
  return (
    <AppFrame user={user} current="/office">
      <WorkOrderView id={id} currency={shop.currency} taxRateBp={shop.taxRateBp} warning={warning?.slice(0, 300)} />
    </AppFrame>
  );
}
