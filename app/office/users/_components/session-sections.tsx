import type { SignInWaitRow } from "@/app/_server/sign-in-waits";
import { formatDayTime } from "@/lib/format/dates";
import { handedOverWhat } from "@/lib/work-orders/open-items";
import type { listOutboxHandovers } from "@/db/auth/outbox-handovers";
import type { listOpenSessions } from "@/db/auth/sessions";
import type { BucketKind } from "@/lib/auth/sign-in-throttle";
import { PostButton } from "./post-button";
import { SettleHandover } from "./settle-handover";

type Sessions = Awaited<ReturnType<typeof listOpenSessions>>;
type Handovers = Awaited<ReturnType<typeof listOutboxHandovers>>;
type WaitRow = SignInWaitRow;

const KIND_LABEL: Record<BucketKind, string> = {
  pair: "One account from one address",
  address: "One address, any account",
  account: "One account from everywhere",
};

/** Who is signed in now, with ending a person's or a tablet's sessions. */
export function OpenSessions({ sessions }: { sessions: Sessions }) {
  return (
    <section className="mt-8" data-testid="open-sessions">
      <h2 className="text-2xl font-bold">Signed in now</h2>
      <p className="mt-1 text-lg text-steel-700">
        Ending a session signs that person out on the device at once. A tablet whose session you end hands its unsent work to you (listed
        below) and clears itself.
      </p>
      <table className="mt-4 w-full border-collapse text-left text-lg">
        <thead>
          <tr className="border-b-2 border-steel-700">
            <th className="py-2 pr-4">Who</th>
            <th className="py-2 pr-4">Tablet</th>
            <th className="py-2 pr-4">From</th>
            <th className="py-2 pr-4">Signed in</th>
            <th className="py-2 pr-4">Last seen</th>
            <th className="py-2 pr-4">
              <span className="sr-only">End</span>
            </th>
          </tr>
        </thead>
        <tbody>
          {sessions.map((s) => (
            <tr key={s.id} className="border-b border-steel-300" data-testid="session-row">
              <td className="py-2 pr-4">{s.userName}</td>
              <td className="py-2 pr-4 font-mono text-base">{s.deviceId ?? "—"}</td>
              <td className="py-2 pr-4 font-mono text-base">{s.clientAddress || "—"}</td>
              <td className="py-2 pr-4">{formatDayTime(s.startedAt)}</td>
              <td className="py-2 pr-4">{formatDayTime(s.lastSeenAt)}</td>
              <td className="flex flex-wrap gap-2 py-2 pr-4">
                <PostButton
                  url="/api/office/sessions"
                  body={{ userId: s.userId }}
                  label="End all of this person's sessions"
                  ariaLabel={`End every session of ${s.userName}`}
                />
                {s.deviceId && (
                  <PostButton
                    url="/api/office/sessions"
                    body={{ deviceId: s.deviceId }}
                    label="End this tablet's sessions"
                    ariaLabel={`End every session on tablet ${s.deviceId}`}
                  />
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      {!sessions.length && <p className="mt-2 text-lg">Nobody is signed in.</p>}
    </section>
  );
}

/** Failed sign-ins of the last hour on the shop's accounts, the wait each asks for, and clearing one. */
export function SignInWaits({ waits }: { waits: WaitRow[] }) {
  return (
    <section className="mt-8" data-testid="sign-in-waits">
      <h2 className="text-2xl font-bold">Sign-in waits</h2>
      <p className="mt-1 text-lg text-steel-700">
        Wrong passwords make the next try from the same place wait a little longer each time (up to 5 minutes). An account is never locked:
        its owner can sign in from elsewhere at once. Clear a wait when you know who it was.
      </p>
      <table className="mt-4 w-full border-collapse text-left text-lg">
        <thead>
          <tr className="border-b-2 border-steel-700">
            <th className="py-2 pr-4">Counted for</th>
            <th className="py-2 pr-4">Account</th>
            <th className="py-2 pr-4">Address</th>
            <th className="py-2 pr-4">Wrong in the last hour</th>
            <th className="py-2 pr-4">Now</th>
            <th className="py-2 pr-4">
              <span className="sr-only">Clear</span>
            </th>
          </tr>
        </thead>
        <tbody>
          {waits.map((w) => (
            <tr key={w.key} className="border-b border-steel-300" data-testid="wait-row">
              <td className="py-2 pr-4">{KIND_LABEL[w.kind]}</td>
              <td className="py-2 pr-4 font-mono text-base">{w.email ?? "any"}</td>
              <td className="py-2 pr-4 font-mono text-base">{w.address ?? "any"}</td>
              <td className="py-2 pr-4">{w.failures}</td>
              <td className="py-2 pr-4 font-bold">
                {w.waitSeconds > 0 ? `■ Waiting ${w.waitSeconds} s` : w.slowed ? "▲ Slowed (1.5 s per try)" : "● No wait"}
              </td>
              <td className="py-2 pr-4">
                <PostButton
                  url="/api/office/sign-in-waits"
                  body={{ key: w.key }}
                  label="Clear"
                  ariaLabel={`Clear the sign-in wait ${w.key}`}
                />
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      {!waits.length && <p className="mt-2 text-lg">No wrong passwords in the last hour.</p>}
    </section>
  );
}

/** Work tablets handed over when their session was ended, to read or keep. */
export function HandedOver({ handovers }: { handovers: Handovers }) {
  if (!handovers.length) return null;
  return (
    <section className="mt-8" data-testid="handovers">
      <h2 className="text-2xl font-bold">Work handed over by tablets</h2>
      <p className="mt-1 text-lg text-steel-700">
        Work handed over is not on the job&apos;s record. Each job it names cannot be marked ready or handed over until you settle it:
        re-enter what belongs on the record, then write what you did.
      </p>
      <ul className="mt-2 flex flex-col gap-4 text-lg">
        {handovers.map((h) => (
          <li key={h.id} data-testid="handover">
            {formatDayTime(h.receivedAt)} — {h.userName} on <span className="font-mono">{h.deviceId}</span>: {h.entryCount} entries not sent
            —{" "}
            <a className="font-bold underline" href={`/api/office/outbox-handovers/${h.id}`}>
              download
            </a>
            {h.jobs.length > 0 && (
              <ul className="ml-6 mt-1 flex flex-col gap-2">
                {h.jobs.map((j) => (
                  <li key={j.workOrderId} data-testid="handover-job">
                    Job #{j.number}: {handedOverWhat(j)} —{" "}
                    {j.settledAt ? (
                      <span>
                        ✔ settled by {j.settledBy} {formatDayTime(j.settledAt)}: “{j.note}”
                      </span>
                    ) : (
                      <span className="font-bold">◷ not settled: the job&apos;s gates wait</span>
                    )}
                    {!j.settledAt && <SettleHandover handoverId={h.id} workOrderId={j.workOrderId} number={j.number} />}
                  </li>
                ))}
              </ul>
            )}
          </li>
        ))}
      </ul>
    </section>
  );
}
