import type { Metadata } from "next";
import Link from "next/link";
import { requirePageArea } from "@/app/_server/session";
import { AppFrame } from "@/app/ui/app-frame";
import { listBookableJobs, listWeek, shopHours } from "@/db/calendar/bookings";
import { listResources } from "@/db/calendar/resources";
import { db } from "@/db/setup/client";
import { addDays, dayIn, dayLabel } from "@/lib/aftercare/reminders";
import { calendarDay, hhmm, isoWeekday, RESOURCE_KIND_LABELS, weekDays, weekStart } from "@/lib/calendar/rules";
import { isUuid } from "@/lib/ids";
import { BookForm } from "./_components/book-form";
import { CancelBooking } from "./_components/cancel-booking";

export const metadata: Metadata = { title: "Week plan" };

const WEEKDAY = ["Mon", "Tue", "Wed", "Thu", "Fri", "Sat", "Sun"];

// The week plan of one resource: each day of the week with its bookings, and a form to book a job.
export default async function CalendarPage({ searchParams }: { searchParams: Promise<{ resource?: string; week?: string }> }) {
  const user = await requirePageArea("office");
  const sp = await searchParams;
  const [resources, hours] = await Promise.all([listResources(db(), user.shopId), shopHours(db(), user.shopId)]);
  const today = dayIn(hours.timeZone);
  const monday = weekStart(sp.week && calendarDay("Week").safeParse(sp.week).success ? sp.week : today);
  const live = resources.filter((r) => !r.retiredAt);
  const resource =
    resources.find((r) => r.id === sp.resource && isUuid(sp.resource ?? "")) ?? live.find((r) => r.kind === "dyno") ?? live[0];
  const [bookings, jobs] = resource
    ? await Promise.all([listWeek(db(), user.shopId, resource.id, monday), listBookableJobs(db(), user.shopId)])
    : [[], []];
  const href = (resourceId: string, week: string) => `/office/calendar?resource=${resourceId}&week=${week}`;
  const days = weekDays(monday);
  // the form offers the week's opening days still to come (a slot already over is refused anyway)
  const openDays = days.filter((d) => hours.openDays.includes(isoWeekday(d)) && d >= today);
  return (
    <AppFrame user={user} current="/office/calendar">
      <h1 className="text-3xl font-bold">Week plan</h1>
      <p className="mt-2 text-lg">
        Open {hhmm(hours.opensAt)}–{hhmm(hours.closesAt)}, {hours.openDays.map((d) => WEEKDAY[d - 1]).join(", ")}. A slot already taken is
        refused with the job that has it.{" "}
        <Link href="/office/calendar/resources" className="font-bold underline">
          Resources and opening hours
        </Link>
      </p>
      <nav aria-label="Resources" className="mt-4 flex flex-wrap gap-3">
        {resources.map((r) => (
          <Link
            key={r.id}
            href={href(r.id, monday)}
            aria-current={r.id === resource?.id ? "page" : undefined}
            className={`flex min-h-12 items-center rounded-lg border-2 px-4 text-lg font-bold ${r.id === resource?.id ? "border-ink bg-signal" : "border-steel-700 bg-white"}`}
          >
            {r.name}
            <span className="ml-2 text-base font-normal">
              {RESOURCE_KIND_LABELS[r.kind]}
              {r.retiredAt ? " · ⊘ retired" : ""}
            </span>
          </Link>
        ))}
      </nav>
      {!resource ? (
        <p className="mt-6 text-lg">The shop has no resources yet.</p>
      ) : (
        <>
          <div className="mt-6 flex flex-wrap items-center gap-4">
            <Link
              href={href(resource.id, addDays(monday, -7))}
              className="flex min-h-12 items-center rounded-lg border-2 border-steel-700 px-4 text-lg font-bold"
            >
              ← Week before
            </Link>
            <h2 className="text-2xl font-bold" data-testid="week-title">
              {resource.name}: week of {dayLabel(monday)}
            </h2>
            <Link
              href={href(resource.id, addDays(monday, 7))}
              className="flex min-h-12 items-center rounded-lg border-2 border-steel-700 px-4 text-lg font-bold"
            >
              Week after →
            </Link>
          </div>
          {resource.retiredAt && (
            <p className="mt-2 text-lg font-bold text-fail">⊘ Retired: {resource.retiredReason}. It can no longer be booked.</p>
          )}
          <ol className="mt-4 grid gap-3" data-testid="week-plan">
            {days.map((d) => {
              const mine = bookings.filter((b) => b.day === d);
              const open = hours.openDays.includes(isoWeekday(d));
              return (
                <li
                  key={d}
                  className={`rounded-xl border-2 p-3 ${d === today ? "border-ink" : "border-steel-300"} ${open ? "bg-white" : "bg-steel-100"}`}
                >
                  <h3 className="text-xl font-bold">
                    {WEEKDAY[isoWeekday(d) - 1]} {dayLabel(d)}
                    {d === today ? " · today" : ""}
                    {!open ? " · closed" : ""}
                  </h3>
                  {open && !mine.length && <p className="text-lg">Free all day.</p>}
                  <ul className="mt-1 grid gap-2">
                    {mine.map((b) => (
                      <li key={b.id} className="flex flex-wrap items-center gap-3 text-lg" data-testid="booking">
                        <span className="font-mono font-bold">
                          ■ {b.from}–{b.to}
                        </span>
                        <Link href={`/office/work-orders/${b.workOrderId}`} className="underline">
                          Job #{b.number}
                        </Link>
                        <span>
                          {b.make} {b.model} · {b.title}
                        </span>
                        <span className="text-base">booked by {b.bookedBy}</span>
                        {b.note && <span className="text-base">“{b.note}”</span>}
                        <CancelBooking bookingId={b.id} label={`job #${b.number}, ${b.from}–${b.to}`} />
                      </li>
                    ))}
                  </ul>
                </li>
              );
            })}
          </ol>
          {!resource.retiredAt && openDays.length > 0 && (
            <section className="mt-6">
              <h2 className="text-2xl font-bold">Book a job on {resource.name}</h2>
              <BookForm
                resourceId={resource.id}
                resourceName={resource.name}
                opensAt={hhmm(hours.opensAt)}
                closesAt={hhmm(hours.closesAt)}
                days={openDays.map((d) => ({ day: d, label: `${WEEKDAY[isoWeekday(d) - 1]} ${dayLabel(d)}` }))}
                jobs={jobs.map((j) => ({ id: j.id, label: `#${j.number} · ${j.make} ${j.model} · ${j.title}` }))}
              />
            </section>
          )}
        </>
      )}
    </AppFrame>
  );
}
