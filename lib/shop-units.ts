import type { TorqueUnit } from "./calc/units";

/**
 * The torque units a shop works in day to day: the one its bench shows first (beside the other)
 * and the one a dyno curve is recorded in. The templates may name any unit of lib/calc/units.
 */
export const SHOP_TORQUE_UNITS = ["N·m", "lbf·ft"] as const satisfies readonly TorqueUnit[];
export type ShopTorqueUnit = (typeof SHOP_TORQUE_UNITS)[number];
