"use client";

import { useState } from "react";
import { boostedCompressionRatio, compressionVolumes, convertPressure, staticCompressionRatio } from "@/lib/calc";
import { fixed, NumberField, readNumber } from "./number-field";

const START = {
  bore: "76",
  stroke: "55",
  chamber: "12.5",
  gasketBore: "77",
  gasketThickness: "0.7",
  deck: "0.2",
  dish: "1.5",
  boostPsi: "10",
};

// Static compression from the build's measured volumes, and the boosted ("effective") figure.
export function CompressionCard() {
  const [v, setV] = useState(START);
  const set = (k: keyof typeof START) => (x: string) => setV({ ...v, [k]: x });
  let result: { cr: number; swept: number; clearance: number; boosted: number } | null = null;
  let error: string | null = null;
  try {
    const input = {
      boreMm: readNumber("Bore", v.bore),
      strokeMm: readNumber("Stroke", v.stroke),
      chamberCc: readNumber("Chamber", v.chamber),
      gasketBoreMm: readNumber("Gasket bore", v.gasketBore),
      gasketThicknessMm: readNumber("Gasket thickness", v.gasketThickness),
      deckClearanceMm: readNumber("Deck clearance", v.deck),
      pistonDishCc: readNumber("Piston dish", v.dish),
    };
    const vol = compressionVolumes(input);
    const cr = staticCompressionRatio(input);
    const boostKpa = convertPressure(readNumber("Boost", v.boostPsi), "psi", "kPa");
    result = { cr, swept: vol.sweptCc, clearance: vol.clearanceCc, boosted: boostedCompressionRatio(cr, boostKpa) };
  } catch (e) {
    error = (e as Error).message;
  }
  return (
    <section aria-labelledby="cr-h" className="rounded-xl border-2 border-steel-300 bg-white p-4">
      <h2 id="cr-h" className="text-2xl font-bold">
        Compression
      </h2>
      <div className="mt-3 grid grid-cols-2 gap-3 md:grid-cols-4">
        <NumberField id="cr-bore" label="Bore" unit="mm" value={v.bore} onChange={set("bore")} />
        <NumberField id="cr-stroke" label="Stroke" unit="mm" value={v.stroke} onChange={set("stroke")} />
        <NumberField id="cr-chamber" label="Chamber" unit="cc" value={v.chamber} onChange={set("chamber")} />
        <NumberField id="cr-dish" label="Piston dish (dome negative)" unit="cc" value={v.dish} onChange={set("dish")} />
        <NumberField id="cr-gbore" label="Gasket bore" unit="mm" value={v.gasketBore} onChange={set("gasketBore")} />
        <NumberField id="cr-gthick" label="Gasket thickness" unit="mm" value={v.gasketThickness} onChange={set("gasketThickness")} />
        <NumberField id="cr-deck" label="Deck clearance (below deck +)" unit="mm" value={v.deck} onChange={set("deck")} />
        <NumberField id="cr-boost" label="Boost" unit="psi" value={v.boostPsi} onChange={set("boostPsi")} />
      </div>
      {error ? (
        <p role="alert" className="mt-3 text-lg font-bold text-fail" data-testid="cr-error">
          {error}
        </p>
      ) : (
        result && (
          <dl className="mt-3 grid grid-cols-2 gap-2 font-mono text-lg md:grid-cols-4" data-testid="cr-result">
            <dt className="font-sans font-bold">Static ratio</dt>
            <dd>{fixed(result.cr, 2)}:1</dd>
            <dt className="font-sans font-bold">Boosted (rule of thumb)</dt>
            <dd>{fixed(result.boosted, 1)}:1</dd>
            <dt className="font-sans font-bold">Swept per cylinder</dt>
            <dd>{fixed(result.swept, 2)} cc</dd>
            <dt className="font-sans font-bold">Clearance volume</dt>
            <dd>{fixed(result.clearance, 2)} cc</dd>
          </dl>
        )
      )}
      <p className="mt-3 text-base">
        The boosted figure is the usual rule of thumb, static ratio × absolute manifold pressure ÷ ambient. It is a way to compare builds,
        not a knock limit: fuel, timing, charge temperature and the tuner&apos;s judgement decide what an engine will take.
      </p>
    </section>
  );
}
