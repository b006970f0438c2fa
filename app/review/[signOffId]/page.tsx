import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { z } from "zod";
import { requirePageArea } from "@/app/_server/session";
import { AppFrame } from "@/app/ui/app-frame";
import { ReviewScreen } from "../_components/review-screen";

export const metadata: Metadata = { title: "Review a sign-off" };

export default async function ReviewSignOffPage({ params }: { params: Promise<{ signOffId: string }> }) {
  const user = await requirePageArea("review");
  const id = z.uuid().safeParse((await params).signOffId);
  if (!id.success) notFound();
  return (
    <AppFrame user={user} current="/review">
      <ReviewScreen signOffId={id.data} canCloseClocks={user.role === "supervisor"} />
    </AppFrame>
  );
}
