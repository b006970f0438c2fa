import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { z } from "zod";
import { requirePageArea } from "@/app/_server/session";
import { AppFrame } from "@/app/ui/app-frame";
import { BuildFiguresTable } from "@/app/ui/build-figures-table";
import { buildFiguresForSignOff } from "@/db/records/build-sheets";
import { db } from "@/db/setup/client";
import { ReviewScreen } from "../_components/review-screen";

export const metadata: Metadata = { title: "Review a sign-off" };

export default async function ReviewSignOffPage({ params }: { params: Promise<{ signOffId: string }> }) {
  const user = await requirePageArea("review");
  const id = z.uuid().safeParse((await params).signOffId);
  if (!id.success) notFound();
  // A stage that measured bore, chamber, deck or gasket shows the build's compression figures beside its targets.
  const figures = await buildFiguresForSignOff(db(), user.shopId, id.data);
  return (
    <AppFrame user={user} current="/review">
      <ReviewScreen signOffId={id.data} canCloseClocks={user.role === "supervisor"} />
      {figures && (
        <div className="mt-6">
          <BuildFiguresTable figures={figures} title="What these readings make: the build's own figures" />
        </div>
      )}
    </AppFrame>
  );
}
