import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { z } from "zod";
import { requirePageArea } from "@/app/_server/session";
import { AppFrame } from "@/app/ui/app-frame";
import { db } from "@/db/setup/client";
import { getCustomer } from "@/db/shop/customers";
import { BikeForm } from "../_components/bike-form";
import { CustomerForm } from "../_components/customer-form";

export const metadata: Metadata = { title: "Customer" };

export default async function CustomerPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requirePageArea("office");
  const id = z.uuid().safeParse((await params).id);
  const c = id.success ? await getCustomer(db(), user.shopId, id.data) : null;
  if (!c) notFound();
  return (
    <AppFrame user={user} current="/office/customers">
      <p>
        <Link href="/office/customers" className="underline">
          ◀ Customers
        </Link>
      </p>
      <h1 className="mt-2 text-3xl font-bold">{c.name}</h1>
      <section className="mt-6">
        <h2 className="text-2xl font-bold">Bikes</h2>
        {c.bikes.length === 0 && <p className="mt-2">No bikes yet.</p>}
        <ul className="mt-3 grid gap-3 md:grid-cols-2">
          {c.bikes.map((b) => (
            <li
              key={b.id}
              className="flex flex-wrap items-center gap-3 rounded-xl border-2 border-steel-700 bg-white p-4"
              data-testid="customer-bike"
            >
              <Link href={`/office/bikes/${b.id}`} className="text-xl font-bold underline">
                {b.make} {b.model} {b.year ? `(${b.year})` : ""}
              </Link>
              <span className="font-mono">{b.tagCode}</span>
              <Link
                href={`/office/work-orders/new?bike=${b.id}`}
                className="ml-auto flex min-h-12 items-center rounded-lg border-2 border-steel-700 px-3 font-bold"
              >
                Book in
              </Link>
            </li>
          ))}
        </ul>
        <details className="mt-4 rounded-xl border-2 border-steel-300 bg-white p-4">
          <summary className="cursor-pointer text-xl font-bold">Add a bike</summary>
          <div className="mt-4">
            <BikeForm customerId={c.id} />
          </div>
        </details>
      </section>
      <section className="mt-8">
        <h2 className="mb-3 text-2xl font-bold">Contact details</h2>
        <CustomerForm customerId={c.id} initial={{ name: c.name, email: c.email ?? "", phone: c.phone ?? "", notes: c.notes }} />
      </section>
    </AppFrame>
  );
}
