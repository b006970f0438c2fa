"use client";

import { ReasonAction } from "@/app/ui/reason-action";

// Cancels a booking with the reason (kept on record); the slot is free again.
export function CancelBooking({ bookingId, label }: { bookingId: string; label: string }) {
  return (
    <ReasonAction
      url={`/api/office/bookings/${bookingId}/cancel`}
      openText="Cancel booking…"
      openLabel={`Cancel booking: ${label}`}
      question="Why cancel?"
      submitText="Cancel it"
    />
  );
}
