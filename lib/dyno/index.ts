/** Dyno runs: corrected curves, peaks, comparisons, boost figures and curve import. Pure code. */
export * from "./run-curve";
export * from "./compare-runs";
export * from "./boost";
export * from "./curve-rows";
export * from "./curve-csv";
export * from "./run-input";
export * from "./plot-scale";
export * from "./run-summary";
export * from "./run-withdrawal";
