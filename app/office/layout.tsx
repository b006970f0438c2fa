import type { ReactNode } from "react";
import { QueryProvider } from "../ui/query-provider";

// Office pages fetch through react-query; each page checks the role itself (requirePageArea).
export default function OfficeLayout({ children }: { children: ReactNode }) {
  return <QueryProvider>{children}</QueryProvider>;
}
