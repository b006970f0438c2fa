import type { Metadata } from "next";
import { requirePageArea } from "@/app/_server/session";
import { AppFrame } from "@/app/ui/app-frame";
import { CustomerForm } from "./_components/customer-form";
import { CustomersTable } from "./_components/customers-table";

export const metadata: Metadata = { title: "Customers" };

export default async function CustomersPage() {
  const user = await requirePageArea("office");
  return (
    <AppFrame user={user} current="/office/customers">
      <h1 className="text-3xl font-bold">Customers</h1>
      <CustomersTable />
      <details className="mt-8 rounded-xl border-2 border-steel-300 bg-white p-4">
        <summary className="cursor-pointer text-xl font-bold">Add a customer</summary>
        <div className="mt-4">
          <CustomerForm />
        </div>
      </details>
    </AppFrame>
  );
}
