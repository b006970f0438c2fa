import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { IntercoolerCard } from "@/app/calculators/_components/intercooler-card";
import { CRANK_FIELDS, formOf, PLANNER_START, type SheetForm } from "@/app/calculators/_components/planner-fields";
import { TurboPlanner } from "@/app/calculators/_components/turbo-planner";
import { requirePageArea } from "@/app/_server/session";
import { AppFrame } from "@/app/ui/app-frame";
import { BuildFiguresTable } from "@/app/ui/build-figures-table";
import { loadBuildNumbers } from "@/db/records/build-sheets";
import { findDynoWorkOrder } from "@/db/records/dyno";
import { db } from "@/db/setup/client";
import { isUuid } from "@/lib/ids";

export const metadata: Metadata = { title: "This build's numbers" };

// A job's turbo and fuel figures, worked from the job's own: displacement from the bike, readings
// from its build, boost from its newest dyno run, and its saved build sheet (with the compressor map
// outline typed from the maker's sheet).
export default async function JobNumbersPage({ params }: { params: Promise<{ id: string }> }) {
  const user = await requirePageArea("dyno");
  const { id } = await params;
  if (!isUuid(id)) notFound();
  const [job, numbers] = await Promise.all([findDynoWorkOrder(db(), user.shopId, id), loadBuildNumbers(db(), user.shopId, id)]);
  if (!job || !numbers) notFound();

  // Planning assumptions from the engine numbers page, then the job's own figures, then what was saved.
  const planning = Object.fromEntries(Object.entries(PLANNER_START).filter(([k]) => !(CRANK_FIELDS as string[]).includes(k))) as SheetForm;
  const fromJob: SheetForm = {};
  if (numbers.displacementCc) fromJob.displacementCc = String(numbers.displacementCc);
  if (numbers.dynoBoost) fromJob.boostKpa = String(Number(numbers.dynoBoost.kpa.toFixed(1)));
  const measured: Record<string, "boreMm" | "strokeMm" | "deckClearanceMm" | "gasketThicknessMm"> = {
    Bore: "boreMm",
    Stroke: "strokeMm",
    "Piston to deck at TDC": "deckClearanceMm",
    "Compressed gasket thickness": "gasketThicknessMm",
  };
  for (const u of numbers.figures.used) {
    const key = measured[u.label];
    if (key && u.source.kind === "readings") fromJob[key] = String(Number(u.value.toFixed(3)));
  }
  const start: SheetForm = { ...planning, ...fromJob, ...formOf(numbers.sheet.figures) };
  const bikeName = `${job.make} ${job.model}`;

  return (
    <AppFrame user={user} current="/dyno">
      <p className="text-lg">
        <Link href="/dyno" className="underline">
          Dyno
        </Link>{" "}
        ›{" "}
        <Link href={`/jobs/${job.id}/dyno`} className="underline">
          #{job.number}
        </Link>{" "}
        › numbers
      </p>
      <h1 className="text-3xl font-bold">Turbo and fuel figures: {bikeName}</h1>
      <p className="mt-1 max-w-3xl text-lg">
        <span className="font-mono">{job.tagCode}</span> · {job.title}. Worked from this job&apos;s figures:{" "}
        {numbers.displacementCc ? `${numbers.displacementCc} cc from the bike` : "no displacement on the bike record"};{" "}
        {numbers.dynoBoost
          ? `boost ${numbers.dynoBoost.value} ${numbers.dynoBoost.unit} from dyno run “${numbers.dynoBoost.label}”`
          : "no dyno run yet, so boost is the planning figure"}
        ; readings from the build; {numbers.saved ? `build sheet saved by ${numbers.saved.savedBy}` : "no build sheet saved yet"}. Parts
        makers&apos; sheets and the engine maker&apos;s data always win.
      </p>
      <div className="mt-6 grid gap-6">
        <BuildFiguresTable figures={numbers.figures} />
        <TurboPlanner
          start={start}
          startFuel={numbers.sheet.fuel ?? "petrol"}
          startOutline={numbers.sheet.mapOutline}
          saveUrl={`/api/jobs/${job.id}/build-sheet`}
        />
        <IntercoolerCard fromRun={numbers.intercooler} />
      </div>
    </AppFrame>
  );
}
