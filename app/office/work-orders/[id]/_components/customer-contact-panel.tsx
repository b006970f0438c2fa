import { MessageForm } from "@/app/ui/message-form";
import { MessageThread, type ThreadMessage } from "@/app/ui/message-thread";
import type { progressUpdatesOf, shareablePhotos } from "@/db/customer-contact/progress-updates";
import { formatDayTime } from "@/lib/format/dates";
import { ProgressUpdateForm } from "./progress-update-form";

const PURPOSE_WORDS: Record<string, string> = {
  step: "Bench",
  intake: "Intake",
  teardown: "Teardown",
  reading: "Reading",
  dyno: "Dyno",
  report: "Report",
};

// The customer's side of the job for the office: the message thread with a reply box, and the
// progress updates shared so far with a form to share another (a note and photos of the job).
export function CustomerContactPanel({
  workOrderId,
  messages,
  updates,
  photos,
}: {
  workOrderId: string;
  messages: ThreadMessage[];
  updates: Awaited<ReturnType<typeof progressUpdatesOf>>;
  photos: Awaited<ReturnType<typeof shareablePhotos>>;
}) {
  const waiting = messages.length > 0 && messages[messages.length - 1].fromCustomer;
  return (
    <div className="mt-8 grid gap-6">
      <section id="customer-thread" className="rounded-xl border-2 border-steel-300 bg-white p-4" data-testid="office-thread">
        <h2 className="text-2xl font-bold">Messages with the customer</h2>
        {waiting && (
          <p className="mt-1 text-lg font-bold" data-testid="thread-waiting">
            ✉ The customer is waiting for an answer.
          </p>
        )}
        <div className="mt-3">
          <MessageThread messages={messages} viewer="office" />
        </div>
        <MessageForm
          url={`/api/office/work-orders/${workOrderId}/messages`}
          label="Answer the customer"
          button="Send the answer"
          testId="office-reply"
        />
      </section>
      <section className="rounded-xl border-2 border-steel-300 bg-white p-4" data-testid="office-progress-updates">
        <h2 className="text-2xl font-bold">Progress updates for the customer</h2>
        {updates.length > 0 && (
          <ol className="mt-3 grid gap-2">
            {updates.map((u) => (
              <li key={u.id} className="text-lg" data-testid="shared-update">
                <span className="font-bold">{formatDayTime(u.postedAt)}</span> · {u.postedBy} · {u.photos.length}{" "}
                {u.photos.length === 1 ? "photo" : "photos"}
                <p className="whitespace-pre-wrap break-words">{u.note}</p>
              </li>
            ))}
          </ol>
        )}
        <ProgressUpdateForm
          workOrderId={workOrderId}
          photos={photos.map((p) => ({
            id: p.id,
            label: `${PURPOSE_WORDS[p.purpose] ?? p.purpose}${p.stepTitle ? `: ${p.stepTitle}` : ""}${p.caption ? ` — ${p.caption}` : ""}, ${formatDayTime(p.takenAt)}`,
          }))}
        />
      </section>
    </div>
  );
}
