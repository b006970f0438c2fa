import type { Generated } from "kysely";
import type { Role } from "@/lib/auth/roles";
import type { ShopTorqueUnit } from "@/lib/shop-units";
import type { DefaultTimestamp } from "./columns";

// The shop, its people and bikes (migration 2026_12_01_001_foundation).

interface ShopsTable {
  id: Generated<string>;
  name: string;
  slug: string;
  time_zone: Generated<string>;
  torque_unit: Generated<ShopTorqueUnit>;
  currency: Generated<string>;
  tax_rate_bp: Generated<number>;
  /** Opening hours (migration 2026_12_05_063): "HH:MM:SS" and ISO weekdays 1 (Mon) to 7 (Sun). */
  opens_at: Generated<string>;
  closes_at: Generated<string>;
  open_days: Generated<number[]>;
  created_at: DefaultTimestamp;
}

export interface CustomersTable {
  id: Generated<string>;
  shop_id: string;
  name: string;
  email: string | null;
  phone: string | null;
  notes: Generated<string>;
  created_at: DefaultTimestamp;
  updated_at: DefaultTimestamp;
}

export interface UsersTable {
  id: Generated<string>;
  shop_id: string;
  email: string;
  name: string;
  role: Role;
  password_hash: string;
  customer_id: string | null;
  active: Generated<boolean>;
  created_at: DefaultTimestamp;
}

interface BikesTable {
  id: Generated<string>;
  shop_id: string;
  customer_id: string;
  make: string;
  model: string;
  year: number | null;
  vin: string | null;
  engine_number: string | null;
  displacement_cc: number | null;
  colour: string | null;
  tag_code: string;
  notes: Generated<string>;
  created_at: DefaultTimestamp;
}

interface SignInAttemptsTable {
  id: Generated<string>;
  key: string;
  succeeded: boolean;
  at: DefaultTimestamp;
  /** The shop of the account tried (migration 050); null when the e-mail is nobody's. */
  shop_id: Generated<string | null>;
}

export interface ShopTables {
  shops: ShopsTable;
  customers: CustomersTable;
  users: UsersTable;
  bikes: BikesTable;
  sign_in_attempts: SignInAttemptsTable;
}
