// Roles and what each may reach. Pure: used by pages, route handlers and the sync merge alike.
export const ROLES = ["mechanic", "supervisor", "office", "customer"] as const;
export type Role = (typeof ROLES)[number];

// Areas of the product. A page or route handler names its area; `canReach` decides.
export type Area =
  | "bench" // scan tags, step through procedures, record work (mechanics; supervisors also work the bench)
  | "review" // review sign-offs and out-of-tolerance readings
  | "decide" // approve / send back
  | "office" // customers, bikes, work orders, quotes, deposits, parts search, tag labels
  | "templates" // author procedure templates, import and export them
  | "bike-records" // a bike's history: work orders, parts fitted, readings (contact details only with customer-contact)
  | "customer-contact" // see customers' e-mail and phone
  | "users" // manage user accounts
  | "audit" // view and export the audit log
  | "my-bikes" // a customer's own bikes
  | "dyno" // record and compare dyno runs on a work order
  | "dyno-withdraw" // withdraw a dyno run recorded by mistake (with a reason; it stays on record)
  | "build-report" // download a work order's handover build report (customers: their own bikes only)
  | "come-backs" // open a come-back on a handed-over bike, see it beside the original build, record findings
  | "calculators"; // engine numbers: compression, charge air, ring gaps, oil clearance, torque units

const AREAS: Record<Area, readonly Role[]> = {
  bench: ["mechanic", "supervisor"],
  review: ["supervisor", "office"],
  decide: ["supervisor", "office"],
  office: ["office"],
  templates: ["office", "supervisor"],
  "bike-records": ["office", "supervisor", "mechanic"],
  "customer-contact": ["office", "supervisor"],
  users: ["office"],
  audit: ["office", "supervisor"],
  "my-bikes": ["customer"],
  dyno: ["office", "supervisor", "mechanic"],
  "dyno-withdraw": ["office", "supervisor"],
  calculators: ["mechanic", "supervisor", "office"],
  "come-backs": ["office", "supervisor"],
  "build-report": ["office", "supervisor", "customer"],
};

export function canReach(role: Role, area: Area): boolean {
  return AREAS[area].includes(role);
}

export function rolesFor(area: Area): readonly Role[] {
  return AREAS[area];
}

// Where each role lands after sign-in.
export function homePathFor(role: Role): string {
  switch (role) {
    case "mechanic":
      return "/bench";
    case "supervisor":
      return "/review";
    case "office":
      return "/office";
    case "customer":
      return "/my-bikes";
  }
}

export function isRole(value: unknown): value is Role {
  return typeof value === "string" && (ROLES as readonly string[]).includes(value);
}
