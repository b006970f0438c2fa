"use client";

// Offered under a scanned tag whose bike was handed over (office and supervisors): opens the
// come-back form in the office pages (online; a full page load).
export function ComeBackOffer({ from }: { from: { workOrderId: string; number: number } }) {
  return (
    <a
      href={`/come-backs/new?original=${from.workOrderId}`}
      data-testid="come-back-offer"
      className="flex min-h-target items-center justify-center rounded-xl border-4 border-steel-900 bg-signal px-6 text-2xl font-bold text-ink"
    >
      ↩ Open a come-back of job #{from.number}
    </a>
  );
}
