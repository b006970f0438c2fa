import type { Metadata } from "next";

export const metadata: Metadata = { title: "Offline" };
export const dynamic = "force-static";

// Shown by the service worker for any page it has no copy of while the network is down.
export default function OfflinePage() {
  return (
    <main className="mx-auto flex min-h-screen max-w-xl flex-col justify-center gap-4 px-6">
      <h1 className="text-4xl font-bold">No network, and no saved copy of this page</h1>
      <p className="text-xl">
        The bench keeps working offline: open{" "}
        <a className="font-bold underline" href="/bench">
          the bench
        </a>{" "}
        to carry on with jobs already on this tablet. Everything you record is kept here and sent when the network returns.
      </p>
    </main>
  );
}
