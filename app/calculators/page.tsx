import type { Metadata } from "next";
import { requirePageArea } from "../_server/session";
import { AppFrame } from "../ui/app-frame";
import { ChargeAirCard } from "./_components/charge-air-card";
import { CompressionCard } from "./_components/compression-card";
import { GapsCard } from "./_components/gaps-card";
import { IntercoolerCard } from "./_components/intercooler-card";
import { PLANNER_START } from "./_components/planner-fields";
import { TurboPlanner } from "./_components/turbo-planner";
import { TorqueUnitsCard } from "./_components/torque-units-card";

export const metadata: Metadata = { title: "Engine numbers" };

// The build arithmetic in one place, worked out in the browser by lib/calc (also offline).
export default async function CalculatorsPage() {
  const user = await requirePageArea("calculators");
  return (
    <AppFrame user={user} current="/calculators">
      <h1 className="text-3xl font-bold">Engine numbers</h1>
      <p className="mt-2 max-w-3xl text-lg">
        Quick arithmetic for a build. Figures here are worked from what you type and from rules of thumb where marked; the engine
        maker&apos;s service data and the parts makers&apos; sheets always win.
      </p>
      <div className="mt-6 grid gap-6">
        <CompressionCard />
        <ChargeAirCard />
        <section aria-labelledby="turbo-h" className="grid gap-6">
          <h2 id="turbo-h" className="text-2xl font-bold">
            Turbo and fuel figures
          </h2>
          <TurboPlanner start={PLANNER_START} />
          <IntercoolerCard />
        </section>
        <GapsCard />
        <TorqueUnitsCard />
      </div>
    </AppFrame>
  );
}
