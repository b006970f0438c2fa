import type { Metadata } from "next";
import Link from "next/link";
import { requirePageArea } from "@/app/_server/session";
import { AppFrame } from "@/app/ui/app-frame";
import { db } from "@/db/setup/client";
import { bikesForLabels } from "@/db/shop/bikes";
import { IntakeForm } from "./_components/intake-form";

export const metadata: Metadata = { title: "Book a bike in" };

export default async function NewWorkOrderPage({ searchParams }: { searchParams: Promise<{ bike?: string }> }) {
  const user = await requirePageArea("office");
  const { bike } = await searchParams;
  const bikes = await bikesForLabels(db(), user.shopId, null);
  return (
    <AppFrame user={user} current="/office">
      <p>
        <Link href="/office" className="underline">
          ◀ Work orders
        </Link>
      </p>
      <h1 className="mt-2 text-3xl font-bold">Book a bike in</h1>
      <p className="mt-2 text-lg">
        New customer or bike? Add them on the{" "}
        <Link href="/office/customers" className="underline">
          customers page
        </Link>{" "}
        first.
      </p>
      <IntakeForm
        bikes={bikes.map((b) => ({
          id: b.id,
          label: `${b.tagCode} · ${b.make} ${b.model}${b.year ? ` (${b.year})` : ""} · ${b.customerName}`,
        }))}
        bikeId={bikes.some((b) => b.id === bike) ? bike : undefined}
      />
    </AppFrame>
  );
}
