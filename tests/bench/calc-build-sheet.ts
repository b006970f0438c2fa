/**
 * Benchmark: computing a full engine build sheet with lib/calc.
 *
 * One sheet = an invented four-cylinder, turbocharged bike engine: bore geometry for 4 cylinders,
 * piston and ring-gap checks, main / rod / cam bearing oil clearances, valve stems and lash,
 * tolerance checks for every reading (readings mixed in mm, in and µm), compression ratios,
 * torque stages and tightening sequences for every fastener group, dyno correction.
 * Prints sheets, readings and evaluations per sheet, ms per sheet and evaluations per second;
 * no pass/fail thresholds.
 *
 *   npx tsx tests/bench/calc-build-sheet.ts
 *
 * `run()` returns the same figures for tests/bench/run-all.ts.
 */
import { pathToFileURL } from "node:url";
import {
  boltLayout,
  boostedCompressionRatio,
  boreGeometry,
  compressorOutletTemperatureK,
  convertPressure,
  convertTorque,
  evaluateTolerance,
  intercoolerOutletTemperatureK,
  chargeDensityKgM3,
  oilClearance,
  powerCorrectionFactor,
  powerKw,
  pressureRatioFromBoost,
  ringGapGuide,
  staticCompressionRatio,
  tighteningSequence,
  torqueStages,
  vaporPressureKpa,
  type BoreReadings,
  type LengthUnit,
  type TighteningPattern,
  type ToleranceSpec,
  type TorqueSpec,
} from "@/lib/calc";

export interface CalcBenchFigures {
  name: string;
  sheets: number;
  readingsPerSheet: number;
  evaluationsPerSheet: number;
  totalMs: number;
  msPerSheet: number;
  bestBatchMsPerSheet: number;
  evaluationsPerSecond: number;
  readingsPerSecond: number;
}

export interface CalcBenchOptions {
  /** Sheets timed (default 10 000). */
  sheets?: number;
  /** Sheets computed before timing, to let the JIT settle (default 300). */
  warmupSheets?: number;
  /** Print the figures (default true). */
  print?: boolean;
}

// ---------------------------------------------------------------------------
// Invented input data (deterministic pseudo-random so every run computes the same sheets)
// ---------------------------------------------------------------------------

function prng(start: number): () => number {
  let s = start >>> 0;
  return () => {
    s = (s + 0x6d2b79f5) >>> 0;
    let t = s;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

interface Reading {
  value: number;
  unit: LengthUnit;
}
interface Check {
  reading: Reading;
  spec: ToleranceSpec;
}
interface SheetInput {
  bores: BoreReadings[];
  boreSpec: ToleranceSpec;
  taperSpec: ToleranceSpec;
  roundSpec: ToleranceSpec;
  pistonSkirts: number[];
  pistonClearanceSpec: ToleranceSpec;
  ringGaps: Reading[]; // top, second per cylinder
  mains: { journals: number[]; bores: number[] };
  rods: { journals: number[]; bores: number[] };
  cams: { journals: number[]; bores: number[] };
  mainClearanceSpec: ToleranceSpec;
  rodClearanceSpec: ToleranceSpec;
  camClearanceSpec: ToleranceSpec;
  valveStems: { stems: number[]; guides: number[] };
  stemClearanceSpec: ToleranceSpec;
  lash: Check[];
  extraChecks: Check[];
  torqueSpecs: TorqueSpec[];
  sequences: Array<[TighteningPattern, number]>;
  deck: number[];
  boostPsi: number;
  dyno: { pressureKpa: number; temperatureC: number; rh: number; torquePoints: Array<[number, number]> };
}

const BORE_MM = 78;

function makeSheet(sheetNumber: number): SheetInput {
  const r = prng(sheetNumber);
  const jitter = (centre: number, spread: number) => centre + (r() - 0.5) * 2 * spread;
  const bores: BoreReadings[] = [];
  for (let c = 0; c < 4; c++) {
    const d = () => ({ thrust: jitter(BORE_MM + 0.012, 0.006), pin: jitter(BORE_MM + 0.008, 0.006) });
    bores.push({ top: d(), middle: d(), bottom: d() });
  }
  const bearingSet = (count: number, journal: number, clearance: number) => {
    const journals: number[] = [];
    const boresOut: number[] = [];
    for (let i = 0; i < count * 2; i++) {
      // two readings per journal, 90° apart
      const j = jitter(journal, 0.004);
      journals.push(j);
      boresOut.push(j + jitter(clearance, 0.008));
    }
    return { journals, bores: boresOut };
  };
  const inchOrMm = (mm: number): Reading =>
    r() < 0.3 ? { value: mm / 25.4, unit: "in" } : r() < 0.5 ? { value: mm * 1000, unit: "µm" } : { value: mm, unit: "mm" };
  const ringGaps: Reading[] = [];
  for (let c = 0; c < 4; c++) {
    ringGaps.push(inchOrMm(jitter(0.42, 0.05)), inchOrMm(jitter(0.52, 0.06)));
  }
  const lashSpecIn: ToleranceSpec = { unit: "mm", min: 0.1, max: 0.2 };
  const lashSpecEx: ToleranceSpec = { unit: "mm", min: 0.2, max: 0.3 };
  const lash: Check[] = [];
  for (let v = 0; v < 16; v++) {
    const spec = v % 4 < 2 ? lashSpecIn : lashSpecEx;
    lash.push({ reading: inchOrMm(jitter(((spec.min ?? 0) + (spec.max ?? 0)) / 2, 0.06)), spec });
  }
  const extraChecks: Check[] = [];
  // crank runout, end float, rod side clearance, cam lift, spring heights, piston pin bores…
  for (let i = 0; i < 300; i++) {
    const nominal = 0.05 + (i % 25) * 0.4;
    extraChecks.push({
      reading: inchOrMm(jitter(nominal, nominal * 0.03)),
      spec: {
        unit: i % 3 === 0 ? "in" : "mm",
        ...(i % 3 === 0
          ? { nominal: nominal / 25.4, min: (nominal * 0.98) / 25.4, max: (nominal * 1.02) / 25.4 }
          : { nominal, min: nominal * 0.98, max: nominal * 1.02 }),
      },
    });
  }
  const torqueSpecs: TorqueSpec[] = [
    { finalValue: 25, unit: "N·m", passes: [{ percent: 40 }, { percent: 100 }], anglePasses: [90, 90] }, // head
    { finalValue: 30, unit: "N·m", passes: [{ percent: 30 }, { percent: 70 }, { percent: 100 }] }, // mains
    { finalValue: 20, unit: "N·m", passes: [{ value: 10 }, { percent: 100 }], anglePasses: [120] }, // rods
    { finalValue: 10, unit: "N·m", passes: [{ percent: 50 }, { percent: 100 }] }, // cam caps
    { finalValue: 18, unit: "lbf·ft", passes: [{ percent: 20 }, { percent: 60 }, { percent: 100 }, { percent: 100 }] }, // turbo flange
    { finalValue: 60, unit: "N·m", passes: [{ percent: 50 }, { percent: 100 }] }, // clutch hub
    { finalValue: 120, unit: "lbf·in", passes: [{ percent: 30 }, { percent: 100 }] }, // covers
  ];
  const sequences: Array<[TighteningPattern, number]> = [
    ["spiral-out", 10], // head
    ["spiral-out", 10], // crankcase mains
    ["linear", 8], // rod nuts
    ["spiral-out", 8], // cam caps
    ["cross", 4], // turbo inlet flange
    ["cross", 4], // turbo outlet flange
    ["cross", 8], // intercooler end tank
    ["cross", 12], // clutch cover
    ["cross", 6], // flywheel / rotor
    ["cross", 16], // crankcase cover
  ];
  const torquePoints: Array<[number, number]> = [];
  for (let rpm = 3000; rpm <= 12000; rpm += 250) torquePoints.push([rpm, jitter(110, 15)]);
  return {
    bores,
    boreSpec: { unit: "mm", nominal: BORE_MM + 0.01, min: BORE_MM, max: BORE_MM + 0.02 },
    taperSpec: { unit: "mm", nominal: 0, max: 0.01 },
    roundSpec: { unit: "mm", nominal: 0, max: 0.01 },
    pistonSkirts: [0, 1, 2, 3].map(() => jitter(BORE_MM - 0.03, 0.005)),
    pistonClearanceSpec: { unit: "mm", min: 0.025, max: 0.05 },
    ringGaps,
    mains: bearingSet(5, 36, 0.032),
    rods: bearingSet(4, 34, 0.036),
    cams: bearingSet(10, 24, 0.05),
    mainClearanceSpec: { unit: "mm", min: 0.02, max: 0.044 },
    rodClearanceSpec: { unit: "mm", min: 0.025, max: 0.05 },
    camClearanceSpec: { unit: "mm", min: 0.03, max: 0.072 },
    valveStems: (() => {
      const stems: number[] = [];
      const guides: number[] = [];
      for (let v = 0; v < 16; v++) {
        const s = jitter(4.48, 0.006);
        stems.push(s);
        guides.push(s + jitter(0.03, 0.012));
      }
      return { stems, guides };
    })(),
    stemClearanceSpec: { unit: "mm", min: 0.01, max: 0.055 },
    lash,
    extraChecks,
    torqueSpecs,
    sequences,
    deck: [0, 1, 2, 3].map(() => jitter(0.15, 0.05)),
    boostPsi: jitter(12, 4),
    dyno: { pressureKpa: jitter(98, 2), temperatureC: jitter(26, 6), rh: jitter(50, 30), torquePoints },
  };
}

// ---------------------------------------------------------------------------
// One sheet
// ---------------------------------------------------------------------------

interface SheetCounts {
  readings: number;
  evaluations: number;
  /** Out-of-spec results (kept so the work cannot be optimised away). */
  flagged: number;
  checksum: number;
}

function computeSheet(s: SheetInput): SheetCounts {
  let readings = 0;
  let evaluations = 0;
  let flagged = 0;
  let checksum = 0;
  const check = (reading: Reading | number, spec: ToleranceSpec) => {
    const res = evaluateTolerance(reading, spec);
    evaluations++;
    if (res.status !== "in") flagged++;
    checksum += res.deviation;
  };

  // cylinders: geometry, every bore reading, taper, out-of-round, piston clearance, ring gaps
  s.bores.forEach((b, c) => {
    const g = boreGeometry(b);
    evaluations++;
    for (const depth of [b.top, b.middle, b.bottom]) {
      check(depth.thrust, s.boreSpec);
      check(depth.pin, s.boreSpec);
      readings += 2;
    }
    check(g.taper.max, s.taperSpec);
    check(g.outOfRound.max, s.roundSpec);
    check(b.bottom.thrust - s.pistonSkirts[c], s.pistonClearanceSpec);
    readings++;
  });
  const gapGuide = ringGapGuide(78, "boosted");
  evaluations++;
  const topSpec: ToleranceSpec = { unit: "mm", min: gapGuide.topRing.minMm, max: gapGuide.topRing.maxMm };
  const secondSpec: ToleranceSpec = { unit: "mm", min: gapGuide.secondRing.minMm, max: gapGuide.secondRing.maxMm };
  s.ringGaps.forEach((gap, i) => {
    check(gap, i % 2 === 0 ? topSpec : secondSpec);
    readings++;
  });

  // bearings: mains, rods, cams, valve stems
  const bearingGroups: Array<[{ journals: number[]; bores: number[] }, ToleranceSpec]> = [
    [s.mains, s.mainClearanceSpec],
    [s.rods, s.rodClearanceSpec],
    [s.cams, s.camClearanceSpec],
    [{ journals: s.valveStems.stems, bores: s.valveStems.guides }, s.stemClearanceSpec],
  ];
  for (const [set, spec] of bearingGroups) {
    const oc = oilClearance(set.journals, set.bores);
    evaluations++;
    readings += set.journals.length * 2;
    for (const c of oc.each) check(c, spec);
  }

  // valve lash and the other measured items
  for (const l of s.lash) {
    check(l.reading, l.spec);
    readings++;
  }
  for (const x of s.extraChecks) {
    check(x.reading, x.spec);
    readings++;
  }

  // compression per cylinder (deck height measured), boosted CR, charge air
  for (const deck of s.deck) {
    const cr = staticCompressionRatio({
      boreMm: 78,
      strokeMm: 52.2,
      chamberCc: 19.5,
      gasketBoreMm: 79,
      gasketThicknessMm: 0.6,
      deckClearanceMm: deck,
      pistonDishCc: 1.2,
    });
    const boostKpa = convertPressure(s.boostPsi, "psi", "kPa");
    checksum += boostedCompressionRatio(cr, boostKpa);
    evaluations += 3;
    readings++;
  }
  const pr = pressureRatioFromBoost(convertPressure(s.boostPsi, "psi", "kPa"));
  const t2 = compressorOutletTemperatureK(303.15, pr, 0.7);
  const t3 = intercoolerOutletTemperatureK(t2, 303.15, 0.7);
  checksum += chargeDensityKgM3(101.325 * pr, t3);
  evaluations += 5;

  // fasteners: stages, sequences and their drawings
  for (const spec of s.torqueSpecs) {
    const passes = torqueStages(spec);
    evaluations++;
    for (const p of passes) {
      if (p.kind === "torque") {
        checksum += convertTorque(p.target, p.unit, "N·m");
        evaluations++;
      }
    }
  }
  for (const [pattern, n] of s.sequences) {
    checksum += tighteningSequence(pattern, n)[0] + boltLayout(pattern, n)[0].x;
    evaluations += 2;
  }

  // dyno: correction and a power curve
  const pv = vaporPressureKpa(s.dyno.temperatureC, s.dyno.rh);
  const cf = powerCorrectionFactor("SAE_J1349", {
    pressureKpa: s.dyno.pressureKpa,
    temperatureC: s.dyno.temperatureC,
    vaporPressureKpa: pv,
  });
  evaluations += 2;
  readings += 3;
  for (const [rpm, tq] of s.dyno.torquePoints) {
    checksum += powerKw(tq * cf, rpm);
    evaluations++;
    readings++;
  }

  return { readings, evaluations, flagged, checksum };
}

// ---------------------------------------------------------------------------
// Runner
// ---------------------------------------------------------------------------

export function run(options: CalcBenchOptions = {}): CalcBenchFigures {
  const sheets = options.sheets ?? 10000;
  const warmup = options.warmupSheets ?? 300;
  const print = options.print ?? true;

  const inputs = Array.from({ length: 64 }, (_, i) => makeSheet(1000 + i));
  let sink = 0;
  for (let i = 0; i < warmup; i++) sink += computeSheet(inputs[i % inputs.length]).checksum;

  const first = computeSheet(inputs[0]);
  const batch = 100;
  let best = Infinity;
  let evaluations = 0;
  let readings = 0;
  const start = performance.now();
  for (let done = 0; done < sheets; done += batch) {
    const count = Math.min(batch, sheets - done);
    const t0 = performance.now();
    for (let i = 0; i < count; i++) {
      const res = computeSheet(inputs[(done + i) % inputs.length]);
      evaluations += res.evaluations;
      readings += res.readings;
      sink += res.checksum + res.flagged;
    }
    best = Math.min(best, (performance.now() - t0) / count);
  }
  const totalMs = performance.now() - start;
  if (!Number.isFinite(sink)) throw new Error("benchmark produced a non-finite checksum");

  const figures: CalcBenchFigures = {
    name: "calc-build-sheet",
    sheets,
    readingsPerSheet: first.readings,
    evaluationsPerSheet: first.evaluations,
    totalMs,
    msPerSheet: totalMs / sheets,
    bestBatchMsPerSheet: best,
    evaluationsPerSecond: evaluations / (totalMs / 1000),
    readingsPerSecond: readings / (totalMs / 1000),
  };
  if (print) {
    const f = (n: number, d = 0) => n.toLocaleString("en-GB", { maximumFractionDigits: d, minimumFractionDigits: d });
    console.log(`calc build sheet — ${f(sheets)} sheets after ${f(warmup)} warm-up (Node ${process.version})`);
    console.log(`  readings per sheet      ${f(figures.readingsPerSheet)}`);
    console.log(`  evaluations per sheet   ${f(figures.evaluationsPerSheet)}`);
    console.log(`  total                   ${f(totalMs, 1)} ms`);
    console.log(`  ms per sheet            ${f(figures.msPerSheet, 4)} (best batch ${f(best, 4)})`);
    console.log(`  evaluations per second  ${f(figures.evaluationsPerSecond)}`);
    console.log(`  readings per second     ${f(figures.readingsPerSecond)}`);
  }
  return figures;
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  run();
}
