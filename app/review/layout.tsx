import type { ReactNode } from "react";
import { QueryProvider } from "../ui/query-provider";

// Review pages fetch through react-query; each page checks the role itself (requirePageArea).
export default function ReviewLayout({ children }: { children: ReactNode }) {
  return <QueryProvider>{children}</QueryProvider>;
}
