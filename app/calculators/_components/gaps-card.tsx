"use client";

import { useState } from "react";
import { oilClearance, ringGapGuide, type RingGapDuty } from "@/lib/calc";
import { fixed, NumberField, readNumber } from "./number-field";

// Ring end-gap guide from the bore, and oil clearances from micrometer and bore-gauge readings.
export function GapsCard() {
  const [bore, setBore] = useState("76");
  const [duty, setDuty] = useState<RingGapDuty>("boosted");
  const [journals, setJournals] = useState("34.988, 34.990, 34.986");
  const [bores, setBores] = useState("35.020, 35.021, 35.019");
  let ring: ReturnType<typeof ringGapGuide> | null = null;
  let ringError: string | null = null;
  try {
    ring = ringGapGuide(readNumber("Bore", bore), duty);
  } catch (e) {
    ringError = (e as Error).message;
  }
  let oil: ReturnType<typeof oilClearance> | null = null;
  let oilError: string | null = null;
  try {
    const list = (label: string, s: string) =>
      s
        .split(/[\s;]+|,\s+/)
        .filter(Boolean)
        .map((x, i) => readNumber(`${label} ${i + 1}`, x));
    oil = oilClearance(list("Journal", journals), list("Bearing bore", bores));
  } catch (e) {
    oilError = (e as Error).message;
  }
  // Clearances are differences of readings: exact at the readings' own three decimals.
  const mm = (x: number) => `${fixed(x, 3)} mm`;
  return (
    <section aria-labelledby="gap-h" className="rounded-xl border-2 border-steel-300 bg-white p-4">
      <h2 id="gap-h" className="text-2xl font-bold">
        Ring gaps and oil clearance
      </h2>
      <div className="mt-3 grid gap-3 md:grid-cols-3">
        <NumberField id="rg-bore" label="Bore" unit="mm" value={bore} onChange={setBore} />
        <label htmlFor="rg-duty" className="flex flex-col gap-1 text-base font-bold">
          Engine
          <select
            id="rg-duty"
            value={duty}
            onChange={(e) => setDuty(e.target.value as RingGapDuty)}
            className="min-h-12 rounded-lg border-2 border-steel-700 bg-white px-3 text-lg"
          >
            <option value="naturally-aspirated">Naturally aspirated</option>
            <option value="boosted">Boosted</option>
          </select>
        </label>
      </div>
      {ringError ? (
        <p role="alert" className="mt-2 font-bold text-fail">
          {ringError}
        </p>
      ) : (
        ring && (
          <p className="mt-2 font-mono text-lg" data-testid="ring-result">
            Top ring {fixed(ring.topRing.minMm, 2)}–{fixed(ring.topRing.maxMm, 2)} mm · second ring {fixed(ring.secondRing.minMm, 2)}–
            {fixed(ring.secondRing.maxMm, 2)} mm
          </p>
        )
      )}
      {ring && <p className="text-base">{ring.caution}</p>}
      <div className="mt-4 grid gap-3 md:grid-cols-2">
        <label htmlFor="oc-j" className="flex flex-col gap-1 text-base font-bold">
          Journal diameters (mm, comma-separated)
          <input
            id="oc-j"
            value={journals}
            onChange={(e) => setJournals(e.target.value)}
            className="min-h-12 rounded-lg border-2 border-steel-700 bg-white px-3 font-mono text-lg"
          />
        </label>
        <label htmlFor="oc-b" className="flex flex-col gap-1 text-base font-bold">
          Bearing bores, same order (mm)
          <input
            id="oc-b"
            value={bores}
            onChange={(e) => setBores(e.target.value)}
            className="min-h-12 rounded-lg border-2 border-steel-700 bg-white px-3 font-mono text-lg"
          />
        </label>
      </div>
      {oilError ? (
        <p role="alert" className="mt-2 font-bold text-fail" data-testid="oil-error">
          {oilError}
        </p>
      ) : (
        oil && (
          <p className="mt-2 font-mono text-lg" data-testid="oil-result">
            Clearances {oil.each.map(mm).join(", ")} · smallest {mm(oil.min)} · largest {mm(oil.max)}
          </p>
        )
      )}
    </section>
  );
}
