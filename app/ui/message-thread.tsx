import { formatDayTime } from "@/lib/format/dates";

// A job's message thread as both sides see it: who wrote, when, and the text as written.
export interface ThreadMessage {
  id: string;
  body: string;
  fromCustomer: boolean;
  writtenAt: Date;
  authorName: string;
}

export function MessageThread({ messages, viewer }: { messages: ThreadMessage[]; viewer: "customer" | "office" }) {
  if (!messages.length) return <p className="text-base text-steel-700">No messages yet.</p>;
  return (
    <ol className="grid gap-3" data-testid="thread">
      {messages.map((m) => {
        const mine = m.fromCustomer === (viewer === "customer");
        return (
          <li
            key={m.id}
            data-testid="thread-message"
            className={`rounded-lg border-2 p-3 ${mine ? "ml-8 border-steel-700 bg-steel-100" : "mr-8 border-steel-300 bg-white"}`}
          >
            <p className="text-base font-bold">
              {m.fromCustomer ? "Customer" : "Workshop"}: {m.authorName} · {formatDayTime(m.writtenAt)}
            </p>
            <p className="mt-1 whitespace-pre-wrap break-words text-lg">{m.body}</p>
          </li>
        );
      })}
    </ol>
  );
}
