import type { Role } from "./roles";

// The signed-in user as every server check sees it (re-read from the database per request).
export interface SessionUser {
  id: string;
  shopId: string;
  role: Role;
  name: string;
  email: string;
  customerId: string | null;
}
