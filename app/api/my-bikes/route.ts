import { NextResponse } from "next/server";
import { requireApiArea } from "@/app/_server/session";
import { bikesOfCustomer } from "@/db/shop/bikes";
import { db } from "@/db/setup/client";

export async function GET() {
  const auth = await requireApiArea("my-bikes");
  if (auth.response) return auth.response;
  const { user } = auth;
  return NextResponse.json({ bikes: user.customerId ? await bikesOfCustomer(db(), user.shopId, user.customerId) : [] });
}
