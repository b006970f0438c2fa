"use client";

import { HomeView } from "./home-view";

const nothing = () => undefined;

/**
 * What the bench shows before its own code has loaded: the first screen with its keypad, rendered
 * on the server (and kept by the service worker), so a tablet paints it from the page itself. It
 * takes no taps (pointer events off, and marked disabled and busy for assistive technology, its
 * heading still read) until the bench replaces it.
 */
export function BenchShell({ failed, onRetry }: { failed?: boolean; onRetry?: () => void }) {
  return (
    <div data-testid="bench-shell" className="flex flex-1 flex-col bg-paper text-ink">
      <div
        role="status"
        className="no-print flex min-h-[68px] items-center border-b-4 border-steel-900 bg-steel-100 px-4 py-2 text-lg font-bold"
      >
        {failed ? "" : "Opening the bench…"}
      </div>
      {failed && (
        <div
          role="alert"
          className="flex flex-wrap items-center gap-4 border-y-4 border-fail bg-fail-light px-6 py-4 text-xl font-bold text-fail"
        >
          ■ The bench&apos;s code could not be loaded on this tablet. Connect it to the shop&apos;s network, then try again.
          <button type="button" onClick={onRetry} className="min-h-target rounded-lg border-4 border-fail bg-white px-5 text-fail">
            Try again
          </button>
        </div>
      )}
      <div aria-disabled="true" aria-busy="true" className="pointer-events-none flex-1">
        <HomeView jobs={null} busy={false} onScan={nothing} onOpenTag={nothing} onOpenJob={nothing} />
      </div>
    </div>
  );
}
