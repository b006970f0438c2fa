import type { Metadata } from "next";
import { db } from "@/db/setup/client";
import { entriesToAcceptOnTheirOwn } from "@/db/review/entry-acceptance";
import { signersOfShop } from "@/db/review/queue";
import { canReach } from "@/lib/auth/roles";
import { requirePageArea } from "../_server/session";
import { AppFrame } from "../ui/app-frame";
import { LateEntries } from "./_components/late-entries";
import { ReviewQueue } from "./_components/review-queue";
import { RunningClocks } from "./_components/running-clocks";

export const metadata: Metadata = { title: "Review" };

export default async function ReviewPage() {
  const user = await requirePageArea("review");
  const [people, late] = await Promise.all([signersOfShop(db(), user.shopId), entriesToAcceptOnTheirOwn(db(), user.shopId, user.id)]);
  return (
    <AppFrame user={user} current="/review">
      <h1 className="text-3xl font-bold">Sign-offs waiting for review</h1>
      <p className="mt-2 text-lg text-steel-700">
        Each stage a mechanic has signed off, newest first, until someone approves it or sends it back.
      </p>
      <ReviewQueue people={people.map((p) => ({ id: p.id, name: p.name }))} />
      <LateEntries jobs={late} officeLinks={canReach(user.role, "office")} />
      <RunningClocks canClose={user.role === "supervisor"} />
    </AppFrame>
  );
}
