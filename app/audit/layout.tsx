import type { ReactNode } from "react";
import { QueryProvider } from "../ui/query-provider";

// The audit page fetches through react-query; the page checks the role itself (requirePageArea).
export default function AuditLayout({ children }: { children: ReactNode }) {
  return <QueryProvider>{children}</QueryProvider>;
}
