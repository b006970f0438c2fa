/**
 * Engine-build computations: pure functions, no runtime dependencies.
 * Inputs are SI (mm, cc, kPa, K, N·m, kW) unless a name says otherwise; every function throws
 * {@link CalcInputError} for impossible input instead of returning NaN.
 */
export { CalcInputError } from "./errors";
export * from "./units";
export * from "./compression";
export * from "./charge-air";
export * from "./power-correction";
export * from "./power";
export * from "./tightening-sequence";
export * from "./torque-stages";
export * from "./bore-geometry";
export * from "./clearance";
export * from "./tolerance";
export * from "./ring-gap";
// Turbo, fuel and crank arithmetic. Their errors speak workshop words ("Engine speed must be between
// 1 and 25 000 rpm; got -5 rpm."); the ranges are data in INPUT_RULES.
export * from "./quantity";
export * from "./input-rules";
export * from "./atmosphere";
export * from "./engine-airflow";
export * from "./rpm-curve";
export * from "./compressor-points";
export * from "./compressor-map";
export * from "./fuels";
export * from "./fuel-system";
export * from "./crank-geometry";
export * from "./intercooler-log";
export * from "./intake-volume";
