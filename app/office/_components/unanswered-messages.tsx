import Link from "next/link";
import type { unansweredThreads } from "@/db/customer-contact/messages";
import { formatDayTime } from "@/lib/format/dates";

type Thread = Awaited<ReturnType<typeof unansweredThreads>>[number];

// Customers' messages nobody has answered yet (the newest message of the job is the customer's),
// longest waiting first: shown near the top of the office's page.
export function UnansweredMessages({ threads }: { threads: Thread[] }) {
  if (!threads.length) return null;
  return (
    <section className="mt-6 rounded-xl border-2 border-steel-900 bg-white p-4" data-testid="unanswered-messages">
      <h2 className="text-2xl font-bold">
        <span aria-hidden="true">✉ </span>Customers waiting for an answer ({threads.length})
      </h2>
      <ul className="mt-2 grid gap-3">
        {threads.map((t) => (
          <li key={t.workOrderId} className="text-lg" data-testid="unanswered-thread">
            <Link href={`/office/work-orders/${t.workOrderId}#customer-thread`} className="font-bold underline">
              Job #{t.number}
            </Link>{" "}
            · {t.customerName} · {t.make} {t.model} · asked {formatDayTime(t.writtenAt)}
            <p className="line-clamp-2 break-words text-base text-steel-700">“{t.body}”</p>
          </li>
        ))}
      </ul>
    </section>
  );
}
