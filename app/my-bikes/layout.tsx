import type { ReactNode } from "react";
import { QueryProvider } from "../ui/query-provider";

// The customer's pages poll deposit status through react-query; the page checks the role itself.
export default function MyBikesLayout({ children }: { children: ReactNode }) {
  return <QueryProvider>{children}</QueryProvider>;
}
