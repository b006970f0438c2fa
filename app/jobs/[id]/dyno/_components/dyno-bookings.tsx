import Link from "next/link";
import type { BookingRow } from "@/db/calendar/bookings";
import { dayLabel } from "@/lib/aftercare/reminders";
import { weekStart } from "@/lib/calendar/rules";

// The job's time booked on the dyno, linked to the dyno's week plan for those who plan the week.
export function DynoBookings({ bookings, linkToPlan }: { bookings: BookingRow[]; linkToPlan: boolean }) {
  return (
    <section className="rounded-xl border-2 border-steel-700 bg-white p-4" data-testid="dyno-bookings">
      <h2 className="text-2xl font-bold">Dyno time booked</h2>
      {!bookings.length ? (
        <p className="mt-1 text-xl">No dyno time booked for this job{linkToPlan ? "" : " — ask the office"}.</p>
      ) : (
        <ul className="mt-2 grid gap-2">
          {bookings.map((b) => {
            const text = `■ ${dayLabel(b.day)}, ${b.from}–${b.to} on ${b.resourceName}`;
            return (
              <li key={b.id} className="text-xl">
                {linkToPlan ? (
                  <Link className="font-bold underline" href={`/office/calendar?resource=${b.resourceId}&week=${weekStart(b.day)}`}>
                    {text}
                  </Link>
                ) : (
                  <span className="font-bold">{text}</span>
                )}
                <span className="ml-2 text-lg">booked by {b.bookedBy}</span>
              </li>
            );
          })}
        </ul>
      )}
    </section>
  );
}
