/**
 * The physical range of every number the turbo, fuel and crank calculations accept, with the name
 * and unit the user sees. Data, so a form can show the same limits the calculation enforces.
 *
 * The ranges are wide on purpose: they refuse what cannot be (a negative speed, a 50 000 rpm
 * engine, a 3 m stroke), not what is unusual. Units are SI unless the unit says otherwise;
 * temperatures are in K (the message adds °C).
 */
import type { QuantityRule } from "./quantity";

const rule = (r: QuantityRule): QuantityRule => Object.freeze(r);

export const INPUT_RULES = Object.freeze({
  // --- engine ---
  engineSpeed: rule({ label: "Engine speed", unit: "rpm", min: 1, max: 25000 }),
  displacement: rule({ label: "Engine displacement (all cylinders)", unit: "cc", min: 20, max: 10000 }),
  volumetricEfficiency: rule({
    label: "Volumetric efficiency",
    unit: "",
    min: 0,
    max: 1.5,
    minExclusive: true,
    hint: "as a fraction: 0.9 means 90 %",
  }),
  bore: rule({ label: "Bore", unit: "mm", min: 20, max: 200 }),
  stroke: rule({ label: "Stroke", unit: "mm", min: 10, max: 250 }),
  rodLength: rule({ label: "Rod length (centre to centre)", unit: "mm", min: 20, max: 600 }),
  staticCompressionRatio: rule({ label: "Static compression ratio", unit: "", min: 2, max: 25, hint: "9.5 means 9.5:1" }),
  intakeClosesAbdc: rule({
    label: "Intake valve closing",
    unit: "°",
    min: -90,
    max: 150,
    hint: "crank degrees after bottom dead centre; negative if it closes before",
  }),
  deckClearance: rule({
    label: "Piston to deck at TDC",
    unit: "mm",
    min: -5,
    max: 10,
    hint: "positive when the crown is below the block deck, negative when it stands proud",
  }),
  compressedGasket: rule({ label: "Compressed head gasket thickness", unit: "mm", min: 0, max: 5 }),
  gasketBore: rule({ label: "Head gasket bore", unit: "mm", min: 20, max: 210 }),
  chamberVolume: rule({ label: "Combustion chamber volume", unit: "cc", min: 1, max: 500 }),
  pistonDish: rule({
    label: "Piston dish",
    unit: "cc",
    min: -100,
    max: 200,
    hint: "positive for a dish or valve reliefs, negative for a dome",
  }),

  // --- air and charge ---
  manifoldPressure: rule({ label: "Manifold pressure (absolute)", unit: "kPa", min: 10, max: 700 }),
  manifoldTemperature: rule({ label: "Manifold air temperature", unit: "K", min: 220, max: 500 }),
  stationPressure: rule({ label: "Air pressure at the engine (station pressure)", unit: "kPa", min: 50, max: 110 }),
  seaLevelPressure: rule({ label: "Sea-level pressure (weather report)", unit: "kPa", min: 85, max: 110 }),
  altitude: rule({ label: "Altitude", unit: "m", min: -500, max: 11000 }),
  ambientTemperature: rule({ label: "Ambient air temperature", unit: "K", min: 220, max: 340 }),
  boost: rule({ label: "Boost (gauge, above the air pressure)", unit: "kPa", min: 0, max: 600 }),
  boostOrVacuum: rule({ label: "Manifold pressure above the air pressure (boost; negative for vacuum)", unit: "kPa", min: -100, max: 600 }),
  filterLoss: rule({ label: "Air filter pressure loss", unit: "kPa", min: 0, max: 20 }),
  intercoolerDrop: rule({ label: "Intercooler pressure drop", unit: "kPa", min: 0, max: 50 }),
  pipingDrop: rule({ label: "Charge piping pressure drop", unit: "kPa", min: 0, max: 50 }),
  compressorEfficiency: rule({
    label: "Compressor efficiency",
    unit: "",
    min: 0.3,
    max: 0.9,
    hint: "as a fraction from the map: 0.72 means 72 %",
  }),
  intercoolerEffectiveness: rule({
    label: "Intercooler effectiveness",
    unit: "",
    min: 0,
    max: 1,
    hint: "as a fraction: 0 for no intercooler, 0.75 means 75 %",
  }),
  referencePressure: rule({ label: "Map reference pressure", unit: "kPa", min: 50, max: 110 }),
  referenceTemperature: rule({ label: "Map reference temperature", unit: "K", min: 250, max: 330 }),
  airMassFlow: rule({ label: "Air mass flow", unit: "kg/s", min: 0, max: 10, minExclusive: true }),
  compressorInletPressure: rule({ label: "Compressor inlet pressure (absolute)", unit: "kPa", min: 30, max: 110 }),
  compressorInletTemperature: rule({ label: "Compressor inlet temperature", unit: "K", min: 220, max: 340 }),
  intercoolerInletTemperature: rule({ label: "Intercooler inlet temperature", unit: "K", min: 220, max: 600 }),
  intercoolerOutletTemperature: rule({ label: "Intercooler outlet temperature", unit: "K", min: 220, max: 600 }),
  intercoolerInletPressure: rule({ label: "Pressure before the intercooler (absolute)", unit: "kPa", min: 30, max: 800 }),
  intercoolerOutletPressure: rule({ label: "Pressure after the intercooler (absolute)", unit: "kPa", min: 30, max: 800 }),

  // --- compressor map outline ---
  mapFlowLbMin: rule({ label: "Corrected air flow", unit: "lb/min", min: 0, max: 500, minExclusive: true }),
  mapFlowKgS: rule({ label: "Corrected air flow", unit: "kg/s", min: 0, max: 4, minExclusive: true }),
  pressureRatio: rule({ label: "Pressure ratio", unit: "", min: 1, max: 8, hint: "outlet over inlet, absolute" }),

  // --- fuel ---
  power: rule({ label: "Target power", unit: "kW", min: 0, max: 3000, minExclusive: true }),
  bsfc: rule({ label: "Brake specific fuel consumption (BSFC)", unit: "g/kWh", min: 150, max: 1000 }),
  injectors: rule({ label: "Number of injectors", unit: "", min: 1, max: 32, integer: true }),
  maxDuty: rule({
    label: "Highest injector duty cycle",
    unit: "",
    min: 0,
    max: 1,
    minExclusive: true,
    hint: "as a fraction: 0.8 means 80 %",
  }),
  fuelDensity: rule({ label: "Fuel density", unit: "kg/L", min: 0.6, max: 1.0 }),
  injectorFlow: rule({ label: "Injector flow", unit: "cc/min", min: 0, max: 10000, minExclusive: true }),
  requiredFlow: rule({ label: "Fuel flow needed per injector", unit: "cc/min", min: 0, max: 20000 }),
  ratedFuelPressure: rule({ label: "Injector rated fuel pressure", unit: "kPa", min: 20, max: 1000 }),
  fuelPressureAcrossInjector: rule({ label: "Fuel pressure across the injector", unit: "kPa", min: 20, max: 1000 }),
  baseFuelPressure: rule({ label: "Base fuel pressure (engine off boost)", unit: "kPa", min: 20, max: 1000 }),
  regulatorRiseRatio: rule({
    label: "Fuel pressure rise per unit of boost",
    unit: "",
    min: 0,
    max: 12,
    hint: "1 for a boost-referenced 1:1 regulator, 0 for a fixed (unreferenced) one",
  }),
  pumpMargin: rule({ label: "Fuel pump margin", unit: "", min: 0, max: 2, hint: "as a fraction: 0.25 means 25 % extra" }),
  pulseWidth: rule({ label: "Injector pulse width", unit: "ms", min: 0, max: 1000 }),
  lambda: rule({ label: "Lambda", unit: "", min: 0.4, max: 3 }),
  airFuelRatio: rule({ label: "Air-fuel ratio", unit: "", min: 1, max: 50, hint: "mass of air per mass of fuel, e.g. 12.5" }),
  stoichiometricAfr: rule({ label: "Stoichiometric air-fuel ratio of the fuel", unit: "", min: 1.5, max: 20 }),
  ethanolPercent: rule({ label: "Ethanol content", unit: "% by volume", min: 0, max: 100 }),
});

export type InputRuleName = keyof typeof INPUT_RULES;
