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
