import type { Role } from "./roles";

// How long a session lasts (server-side, table `sessions`). Every request of a signed-in user
// slides the idle expiry forward; nothing extends a session past its absolute end.
//   - absolute: 12 hours from sign-in, a working day — re-authentication at least every 12 hours
//     (OWASP ASVS 4.0 3.3.2, level 2);
//   - idle: 30 minutes for the office and customers (ASVS 3.3.2's idle figure); 2 hours for the
//     bench roles (mechanic, supervisor), whose tablet sits through cure timers and Wi-Fi drops.
//     The bench page talks to the server at least every minute while it is open (sync, the session
//     check), so an open bench renews itself — the sliding renewal — and a tablet put away lapses.
export const SESSION_ABSOLUTE_S = 12 * 3600;
export const SESSION_IDLE_S: Record<Role, number> = { mechanic: 2 * 3600, supervisor: 2 * 3600, office: 30 * 60, customer: 30 * 60 };
/** A session's last-seen time is written at most this often (a renewal is one UPDATE, not one per request). */
export const SESSION_RENEW_EVERY_S = 60;

export const SESSION_END_REASONS = ["signed-out", "ended-by-office", "tablet-ended-by-office", "user-turned-off", "password-set"] as const;
export type SessionEndReason = (typeof SESSION_END_REASONS)[number];

/** Header on a 401 whose session was ended on the server (not merely expired): the tablet then clears its store. */
export const SESSION_STATE_HEADER = "benchtag-session";
export type SessionState = "ended" | "expired";

/** Reasons that came from someone else (the office, or a user turned off): the tablet must let go of its data. */
export function endedByOthers(reason: SessionEndReason | null): boolean {
  return reason === "ended-by-office" || reason === "tablet-ended-by-office" || reason === "user-turned-off";
}
