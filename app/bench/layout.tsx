import type { ReactNode } from "react";
import { ServiceWorkerStatus } from "../ui/service-worker-status";

// The service worker is registered here, from the bench only: a visitor to the sign-in page, the
// office or the customer's pages downloads no precache. Its scope stays the whole site ("/"), so
// the bench's offline fallback page (/offline) and the static files it caches are in reach.
export default function BenchLayout({ children }: { children: ReactNode }) {
  return (
    <>
      {children}
      <ServiceWorkerStatus />
    </>
  );
}
