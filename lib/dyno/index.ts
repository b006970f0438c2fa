/** Dyno runs: corrected curves, peaks, comparisons at one standard, boost targets, logged channels and their marks, curve and logged-file import. Pure code. */
export * from "./run-curve";
export * from "./compare-runs";
export * from "./boost";
export * from "./curve-rows";
export * from "./curve-csv";
export * from "./run-input";
export * from "./plot-scale";
export * from "./run-summary";
export * from "./run-withdrawal";
export * from "./channels";
export * from "./channel-marks";
export * from "./column-mapping";
export * from "./logged-csv";
export * from "./tune-version";
export * from "./cell-cautions";
