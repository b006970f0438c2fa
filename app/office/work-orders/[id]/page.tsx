import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { z } from "zod";
import { requirePageArea } from "@/app/_server/session";
import { AppFrame } from "@/app/ui/app-frame";
import { db } from "@/db/setup/client";
import { WorkOrderView } from "./_components/work-order-view";

export const metadata: Metadata = { title: "Work order" };

export default async function WorkOrderPage({ params, searchParams }: { params: Promise<{ id: string }>; searchParams: Promise<{ warning?: string }> }) {
  const user = await requirePageArea("office");
  const id = z.uuid().safeParse((await params).id);
  if (!id.success) notFound();
  const exists = await db().selectFrom("work_orders").select("id").where("id", "=", id.data).where("shop_id", "=", user.shopId).executeTakeFirst();
  if (!exists) notFound();
  const shop = await db().selectFrom("shops").select(["currency", "tax_rate_bp"]).where("id", "=", user.shopId).executeTakeFirstOrThrow();
  const { warning } = await searchParams;
  return (
    <AppFrame user={user} current="/office">
      <WorkOrderView id={id.data} currency={shop.currency} taxRateBp={shop.tax_rate_bp} warning={warning?.slice(0, 300)} />
    </AppFrame>
  );
}
