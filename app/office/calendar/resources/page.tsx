import type { Metadata } from "next";
import Link from "next/link";
import { requirePageArea } from "@/app/_server/session";
import { AppFrame } from "@/app/ui/app-frame";
import { shopHours } from "@/db/calendar/bookings";
import { listResources } from "@/db/calendar/resources";
import { listShopUsers } from "@/db/shop/users";
import { db } from "@/db/setup/client";
import { formatDay } from "@/lib/format/dates";
import { hhmm, RESOURCE_KIND_LABELS } from "@/lib/calendar/rules";
import { AddResourceForm, OpeningHoursForm, RetireResource } from "./_components/resource-forms";

export const metadata: Metadata = { title: "Resources and opening hours" };

// What the week plan books: the shop's bays, lifts, dyno and mechanics (added, or retired with a
// reason — never deleted, their bookings stay on record), and the opening hours bookings must fit.
export default async function ResourcesPage() {
  const user = await requirePageArea("office");
  const [resources, hours, people] = await Promise.all([
    listResources(db(), user.shopId),
    shopHours(db(), user.shopId),
    listShopUsers(db(), user.shopId),
  ]);
  const mechanics = people.filter((p) => p.role === "mechanic" && p.active).map((p) => ({ id: p.id, name: p.name }));
  return (
    <AppFrame user={user} current="/office/calendar">
      <Link href="/office/calendar" className="text-lg underline">
        ← Week plan
      </Link>
      <h1 className="mt-2 text-3xl font-bold">Resources and opening hours</h1>
      <section className="mt-6">
        <h2 className="text-2xl font-bold">Opening hours</h2>
        <p className="mt-1 text-lg">
          New bookings must fit these hours (shop time, {hours.timeZone}); bookings already made stay as they are.
        </p>
        <OpeningHoursForm opensAt={hhmm(hours.opensAt)} closesAt={hhmm(hours.closesAt)} openDays={hours.openDays} />
      </section>
      <section className="mt-8">
        <h2 className="text-2xl font-bold">The shop&apos;s resources</h2>
        <ul className="mt-3 grid gap-3" data-testid="resource-list">
          {resources.map((r) => (
            <li
              key={r.id}
              data-testid="resource-row"
              className="flex flex-wrap items-center gap-3 rounded-xl border-2 border-steel-300 bg-white p-3"
            >
              <span className="text-xl font-bold">{r.name}</span>
              <span className="text-lg">
                {RESOURCE_KIND_LABELS[r.kind]}
                {r.userName ? ` · ${r.userName}` : ""}
              </span>
              {r.retiredAt ? (
                <span className="text-lg font-bold text-fail">
                  ⊘ Retired {formatDay(r.retiredAt)}: {r.retiredReason}
                </span>
              ) : (
                <>
                  <span className="text-lg font-bold text-pass">● In use</span>
                  <RetireResource resourceId={r.id} name={r.name} />
                </>
              )}
            </li>
          ))}
        </ul>
      </section>
      <section className="mt-8">
        <h2 className="text-2xl font-bold">Add a resource</h2>
        <AddResourceForm mechanics={mechanics} />
      </section>
    </AppFrame>
  );
}
