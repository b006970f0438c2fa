import type { Metadata } from "next";
import Link from "next/link";
import { requirePageArea } from "@/app/_server/session";
import { AppFrame } from "@/app/ui/app-frame";
import { formatDayTime } from "@/lib/format/dates";
import { outboxForOffice } from "@/db/mail/outbox";
import { db } from "@/db/setup/client";
import type { MailState } from "@/db/schema/mail";
import { PostButton } from "../users/_components/post-button";

export const metadata: Metadata = { title: "E-mail outbox" };

// State in colour, words and shape.
const STATE: Record<MailState, { mark: string; words: string; className: string }> = {
  queued: { mark: "◷", words: "Waiting for a try", className: "text-warn" },
  sending: { mark: "➜", words: "Being sent", className: "text-warn" },
  sent: { mark: "✔", words: "Sent", className: "text-pass" },
  failed: { mark: "✖", words: "Failed — not sent", className: "text-fail" },
};

type Row = Awaited<ReturnType<typeof outboxForOffice>>["open"][number];

function MailTable({ rows, testId, tryAgain }: { rows: Row[]; testId: string; tryAgain: boolean }) {
  if (!rows.length) return <p className="mt-4 text-lg">None.</p>;
  return (
    <table className="mt-4 w-full table-fixed border-collapse text-left text-lg" data-testid={testId}>
      <thead>
        <tr className="border-b-2 border-steel-700">
          <th className="py-2 pr-4">State</th>
          <th className="py-2 pr-4">To</th>
          <th className="py-2 pr-4">Subject</th>
          <th className="py-2 pr-4">Work order</th>
          <th className="py-2 pr-4">Tries</th>
          <th className="py-2 pr-4">{tryAgain ? "Queued / last error" : "Sent"}</th>
          {tryAgain && (
            <th className="py-2 pr-4">
              <span className="sr-only">Try again</span>
            </th>
          )}
        </tr>
      </thead>
      <tbody>
        {rows.map((m) => {
          const s = STATE[m.state];
          return (
            <tr key={m.id} className="border-b border-steel-300" data-testid="mail-row">
              <td className={`py-2 pr-4 font-bold ${s.className}`}>
                <span aria-hidden="true">{s.mark}</span> {s.words}
              </td>
              <td className="py-2 pr-4 font-mono text-base break-all">{m.recipient}</td>
              <td className="py-2 pr-4 break-words">{m.subject}</td>
              <td className="py-2 pr-4">
                {m.workOrderId ? <Link href={`/office/work-orders/${m.workOrderId}`}>#{m.workOrderNumber}</Link> : "—"}
              </td>
              <td className="py-2 pr-4">{m.attempts}</td>
              <td className="py-2 pr-4">
                {tryAgain ? (
                  <>
                    {formatDayTime(m.queuedAt)}
                    {m.lastError && <span className="block text-base break-all text-fail">{m.lastError}</span>}
                  </>
                ) : (
                  m.sentAt && formatDayTime(m.sentAt)
                )}
              </td>
              {tryAgain && (
                <td className="py-2 pr-4">
                  {m.state === "failed" && (
                    <PostButton
                      url="/api/office/outbox-mail"
                      body={{ id: m.id }}
                      label="Try again"
                      ariaLabel={`Try again: ${m.subject} to ${m.recipient}`}
                    />
                  )}
                </td>
              )}
            </tr>
          );
        })}
      </tbody>
    </table>
  );
}

export default async function OutboxMailPage() {
  const user = await requirePageArea("office");
  const { open, sent } = await outboxForOffice(db(), user.shopId);
  return (
    <AppFrame user={user} current="/office/outbox-mail">
      <h1 className="text-3xl font-bold">E-mail outbox</h1>
      <p className="mt-2 max-w-3xl text-lg">
        Every e-mail to a customer or supervisor waits here until it is sent. A send that fails is tried again after 30 seconds, then 1, 2,
        4 and 8 minutes; after that it is marked failed and can be tried again from here.
      </p>
      <section className="mt-8">
        <h2 className="text-2xl font-bold">Not sent yet</h2>
        <MailTable rows={open} testId="mail-open" tryAgain />
      </section>
      <section className="mt-8">
        <h2 className="text-2xl font-bold">Sent lately</h2>
        <MailTable rows={sent} testId="mail-sent" tryAgain={false} />
      </section>
    </AppFrame>
  );
}
