import { NextResponse } from "next/server";
import { handlePaymentWebhook } from "@/app/_server/payment-webhook";
import { db } from "@/db/setup/client";

// The payment service's webhook. No session: the signature is the check (see payment-webhook.ts).
export async function POST(req: Request) {
  const raw = await req.text();
  const answer = await handlePaymentWebhook(db(), raw, req.headers.get("stripe-signature"));
  return NextResponse.json(answer.body, { status: answer.status });
}
