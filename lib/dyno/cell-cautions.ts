/**
 * Cautions for work in the dyno cell, shown on the dyno page and carried by the first-start
 * template's dyno step. Common practice of dyno cells; the cell's own rules and the dyno maker's
 * instructions come first.
 */
export const DYNO_CELL_CAUTIONS = [
  "Tie the bike down at both ends with rated straps on solid points, and check them again before every pull.",
  "Cooling fan on and aimed at the radiator and intercooler before the engine is under load.",
  "Exhaust extraction on and connected to the tailpipe before starting: exhaust gas in a closed cell kills.",
  "Hearing protection for everyone in the cell while the engine runs.",
  "Nobody stands in line with the drive wheel or the roller, in front of or behind it, during a pull.",
] as const;
