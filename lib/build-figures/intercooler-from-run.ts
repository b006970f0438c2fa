/**
 * Intercooler effectiveness and pressure drop from a dyno run's logged channels: intake air before
 * and after the intercooler (°C), the run's air temperature as ambient, and — when both were
 * logged — the charge pressure before the intercooler and the manifold boost after it (gauge,
 * made absolute with the run's air pressure). Read at the point where the charge was hottest
 * going in (the top of the pull), by lib/calc's intercoolerFromLog.
 */
import { CalcInputError, intercoolerFromLog, KELVIN_AT_0_C, type IntercoolerLogResult } from "@/lib/calc";
import { runChannelSeries, type StoredDynoRun } from "@/lib/dyno/run-summary";

export interface IntercoolerFromRun {
  runLabel: string;
  rpm: number;
  inletC: number;
  outletC: number;
  ambientC: number;
  result: IntercoolerLogResult | null;
  /** Why there is no result (in workshop words), when there is none. */
  problem: string | null;
}

/** The newest run (of those given, oldest first) that logged both intake temperatures, rated; null when none did. */
export function intercoolerFromRuns(runs: readonly StoredDynoRun[]): IntercoolerFromRun | null {
  for (const run of [...runs].reverse()) {
    const s = runChannelSeries(run);
    const before = s.iatBeforeCooler;
    const after = s.iatAfterCooler;
    if (!before?.length || !after?.length) continue;
    const hottest = before.reduce((a, b) => (b.value > a.value ? b : a));
    const out = after.find((p) => p.rpm === hottest.rpm);
    if (!out) continue;
    const charge = s.chargePressure?.find((p) => p.rpm === hottest.rpm);
    const boost = s.boost?.find((p) => p.rpm === hottest.rpm);
    const base = { runLabel: run.label, rpm: hottest.rpm, inletC: hottest.value, outletC: out.value, ambientC: run.temperatureC };
    try {
      const result = intercoolerFromLog({
        inletTempK: hottest.value + KELVIN_AT_0_C,
        outletTempK: out.value + KELVIN_AT_0_C,
        ambientTempK: run.temperatureC + KELVIN_AT_0_C,
        ...(charge && boost ? { inletPressureKpa: run.pressureKpa + charge.value, outletPressureKpa: run.pressureKpa + boost.value } : {}),
      });
      return { ...base, result, problem: null };
    } catch (e) {
      if (!(e instanceof CalcInputError)) throw e;
      return { ...base, result: null, problem: e.message };
    }
  }
  return null;
}
