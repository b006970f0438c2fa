import type { Metadata } from "next";
import { currentUser } from "@/app/_server/session";
import { ExtraWorkAnswers } from "@/app/ui/extra-work-answers";
import { SupplementLines } from "@/app/ui/supplement-lines";
import { linkRefusal, linkState, supplementsOf, supplementWorkOrder } from "@/db/office/supplements";
import { db } from "@/db/setup/client";
import { extraWorkLinkShowsDetails } from "@/lib/office/extra-work";

export const metadata: Metadata = { title: "Extra work on your bike" };
export const dynamic = "force-dynamic";

// The page of the e-mailed one-time link: no sign-in needed (the link is the check). An unknown,
// expired or used link, or one sent to another customer than the one signed in, says so and
// offers nothing to change; the answers already given are shown until the link's own end (after
// that, only to its customer signed in: lib/office/extra-work.ts extraWorkLinkShowsDetails).
export default async function ExtraWorkLinkPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const state = /^[A-Za-z0-9_-]{43}$/.test(token) ? await linkState(db(), token) : ({ kind: "unknown" } as const);
  const user = await currentUser().catch(() => null);
  const refused = linkRefusal(state, user?.customerId ?? null);
  const supplement =
    state.kind === "unknown"
      ? null
      : (await supplementsOf(db(), [await supplementWorkOrder(db(), state.supplementId)])).find((s) => s.id === state.supplementId);
  const wire = JSON.parse(JSON.stringify(supplement ?? null));
  const mayShow = extraWorkLinkShowsDetails(state, { signedIn: Boolean(user), customerId: user?.customerId ?? null });
  return (
    <main className="mx-auto flex min-h-screen max-w-3xl flex-col gap-4 px-6 py-8 text-lg">
      <h1 className="text-3xl font-bold">Extra work on your bike</h1>
      {refused && (
        <p
          role="alert"
          className="rounded-lg border-2 border-fail bg-fail-light px-4 py-3 text-lg font-bold text-fail"
          data-testid="link-refused"
        >
          ✖ {refused.message}
        </p>
      )}
      {!refused && mayShow && wire && (
        <ExtraWorkAnswers supplement={wire} currency={wire.currency} photoBase={null} submit={{ url: "/api/extra-work/answers", token }} />
      )}
      {refused && mayShow && wire && (
        <section className="rounded-lg border-2 border-steel-300 p-3">
          <h2 className="text-xl font-bold">Extra work {wire.number}</h2>
          <SupplementLines supplement={wire} currency={wire.currency} />
        </section>
      )}
      <p>
        <a className="font-bold underline" href="/my-bikes">
          Sign in to your page
        </a>{" "}
        to see the photos, your bike&apos;s progress and your bill.
      </p>
    </main>
  );
}
