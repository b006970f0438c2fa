import type { Metadata } from "next";
import { requirePageArea } from "@/app/_server/session";
import { AppFrame } from "@/app/ui/app-frame";
import { PartsSearch } from "./_components/parts-search";

export const metadata: Metadata = { title: "Parts search" };

export default async function PartsPage() {
  const user = await requirePageArea("office");
  return (
    <AppFrame user={user} current="/office/parts">
      <h1 className="text-3xl font-bold">Parts search</h1>
      <p className="mt-2 max-w-3xl text-lg">
        Find every bike a batch, serial or part number went into — for a supplier recall or a warranty question.
      </p>
      <PartsSearch />
    </AppFrame>
  );
}
