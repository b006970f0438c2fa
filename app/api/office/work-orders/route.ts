import { NextResponse } from "next/server";
import { requireApiArea } from "@/app/_server/session";
import { db } from "@/db/client";
import { listWorkOrders } from "@/db/work-orders";

export async function GET() {
  const auth = await requireApiArea("office");
  if (auth.response) return auth.response;
  return NextResponse.json({ workOrders: await listWorkOrders(db(), auth.user.shopId) });
}
