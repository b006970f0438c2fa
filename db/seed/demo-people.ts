import type { Role } from "@/lib/auth/roles";

// The invented demo workshop's sign-ins (demo only), apart from the seed's database code so the
// browser tests can read them without loading any server module.
export const DEMO_PASSWORD = "benchtag-demo";

export const DEMO_USERS: Array<{ key: string; email: string; name: string; role: Role; customerKey?: string }> = [
  { key: "office", email: "maren@gannet-street.test", name: "Maren Ostby", role: "office" },
  { key: "supervisor", email: "dana@gannet-street.test", name: "Dana Kowal", role: "supervisor" },
  { key: "mechanic", email: "tomas@gannet-street.test", name: "Tomas Reyes", role: "mechanic" },
  { key: "mechanic2", email: "priya@gannet-street.test", name: "Priya Vance", role: "mechanic" },
  { key: "customer", email: "felix.amadi@example.test", name: "Felix Amadi", role: "customer", customerKey: "felix" },
  { key: "customer2", email: "ruth.calloway@example.test", name: "Ruth Calloway", role: "customer", customerKey: "ruth" },
];
