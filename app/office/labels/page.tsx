import type { Metadata } from "next";
import Link from "next/link";
import QRCode from "qrcode";
import { z } from "zod";
import { requirePageArea } from "@/app/_server/session";
import { AppFrame } from "@/app/ui/app-frame";
import { db } from "@/db/setup/client";
import { bikesForLabels } from "@/db/shop/bikes";
import { PrintButton } from "./_components/print-button";
import "./labels.css";

export const metadata: Metadata = { title: "Tag labels" };

const PER_SHEET = 21;
const ids = z.array(z.uuid()).max(200);

// A sheet of tag labels to print: QR code (the tag code) and the code in large letters.
// ?bike=<id> (repeatable) prints chosen bikes; otherwise every bike of the shop.
export default async function LabelsPage({ searchParams }: { searchParams: Promise<{ bike?: string | string[] }> }) {
  const user = await requirePageArea("office");
  const { bike } = await searchParams;
  const chosen = ids.safeParse(bike === undefined ? [] : Array.isArray(bike) ? bike : [bike]);
  const list = chosen.success && chosen.data.length ? chosen.data : null;
  const bikes = await bikesForLabels(db(), user.shopId, list);
  const labels = await Promise.all(
    bikes.map(async (b) => ({ ...b, svg: await QRCode.toString(b.tagCode, { type: "svg", margin: 0, errorCorrectionLevel: "M" }) })),
  );
  const sheets: (typeof labels)[] = [];
  for (let i = 0; i < labels.length; i += PER_SHEET) sheets.push(labels.slice(i, i + PER_SHEET));
  return (
    <AppFrame user={user} current="/office/labels">
      <div className="no-print">
        <h1 className="text-3xl font-bold">Tag labels</h1>
        <p className="mt-2 max-w-3xl text-lg">
          {labels.length} label{labels.length === 1 ? "" : "s"} on {sheets.length} A4 sheet{sheets.length === 1 ? "" : "s"} (3 × 7 labels,
          70 × 42 mm).{" "}
          {list ? (
            <Link href="/office/labels" className="underline">
              Show every bike
            </Link>
          ) : (
            "Every bike of the shop."
          )}
        </p>
        {!chosen.success && (
          <p role="alert" className="mt-2 font-bold text-fail">
            That list of bikes could not be read; showing every bike instead.
          </p>
        )}
        <div className="mt-4 mb-6">
          <PrintButton />
        </div>
      </div>
      {sheets.map((sheet, si) => (
        <div key={si} className="label-sheet mb-8" data-testid="label-sheet">
          {sheet.map((l) => (
            <div key={l.id} className="tag-label" data-testid="tag-label">
              <div dangerouslySetInnerHTML={{ __html: l.svg }} aria-label={`QR code for ${l.tagCode}`} role="img" />
              <div className="min-w-0">
                <p className="font-mono text-lg font-bold leading-tight whitespace-nowrap">{l.tagCode}</p>
                <p className="truncate text-sm">
                  {l.make} {l.model}
                  {l.year ? ` ${l.year}` : ""}
                </p>
              </div>
            </div>
          ))}
        </div>
      ))}
    </AppFrame>
  );
}
