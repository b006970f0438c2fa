import type { Metadata } from "next";
import { db } from "@/db/setup/client";
import { shopSettings } from "@/db/shop/settings";
import { requirePageArea } from "../_server/session";
import { AppFrame } from "../ui/app-frame";
import { BenchBoot } from "./_components/bench-boot";

export const metadata: Metadata = { title: "Bench" };

// The bench is one page: the role is checked here on the server, then every screen runs from
// IndexedDB in the browser (the service worker keeps this page for offline use). The first screen
// is rendered here as a shell; the bench's own code loads right after it paints.
export default async function BenchPage() {
  const user = await requirePageArea("bench");
  const shop = await shopSettings(db(), user.shopId);
  return (
    <AppFrame user={user} current="/bench" flush>
      <BenchBoot user={{ id: user.id, name: user.name, role: user.role, torqueUnit: shop.torqueUnit }} />
    </AppFrame>
  );
}
