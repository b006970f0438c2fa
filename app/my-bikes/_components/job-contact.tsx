import { MessageForm } from "@/app/ui/message-form";
import { MessageThread, type ThreadMessage } from "@/app/ui/message-thread";
import { formatDayTime } from "@/lib/format/dates";

export interface SharedUpdate {
  id: string;
  note: string;
  postedAt: Date;
  postedBy: string;
  photos: Array<{ id: string; caption: string }>;
}

// What the workshop shared about one job (notes and photos, newest first) and the job's
// questions-and-answers thread with a box to write in.
export function JobContact({
  workOrderId,
  updates,
  messages,
}: {
  workOrderId: string;
  updates: SharedUpdate[];
  messages: ThreadMessage[];
}) {
  return (
    <div className="mt-3 grid gap-4">
      {updates.length > 0 && (
        <section className="rounded-lg border-2 border-steel-300 p-3" data-testid="my-progress-updates">
          <h3 className="text-xl font-bold">News from the workshop</h3>
          <ol className="mt-2 grid gap-4">
            {updates.map((u) => (
              <li key={u.id} data-testid="my-progress-update">
                <p className="text-base font-bold">
                  {formatDayTime(u.postedAt)} · {u.postedBy}
                </p>
                <p className="whitespace-pre-wrap break-words text-lg">{u.note}</p>
                {u.photos.length > 0 && (
                  <div className="mt-2 grid grid-cols-2 gap-4">
                    {u.photos.map((p) => (
                      // eslint-disable-next-line @next/next/no-img-element -- a private photo served by our own route
                      <img
                        key={p.id}
                        src={`/api/my-bikes/photos/${p.id}`}
                        alt={p.caption || "Photo from the workshop"}
                        className="w-full rounded-lg border-2 border-steel-300"
                        data-testid="my-progress-photo"
                      />
                    ))}
                  </div>
                )}
              </li>
            ))}
          </ol>
        </section>
      )}
      <section className="rounded-lg border-2 border-steel-300 p-3" data-testid="my-thread">
        <h3 className="text-xl font-bold">Questions and answers</h3>
        <div className="mt-2">
          <MessageThread messages={messages} viewer="customer" />
        </div>
        <MessageForm
          url={`/api/my-bikes/work-orders/${workOrderId}/messages`}
          label="Ask the workshop"
          button="Send"
          testId={`ask-${workOrderId}`}
        />
      </section>
    </div>
  );
}
