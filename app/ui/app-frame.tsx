import Link from "next/link";
import type { ReactNode } from "react";
import { canReach, type Area } from "@/lib/auth/roles";
import type { SessionUser } from "@/lib/auth/session-user";
import { ReviewCount } from "./review-count";
import { SignOutButton } from "./sign-out-button";

const NAV: Array<{ href: string; label: string; area: Area }> = [
  { href: "/bench", label: "Bench", area: "bench" },
  { href: "/review", label: "Review", area: "review" },
  { href: "/office", label: "Work orders", area: "office" },
  { href: "/dyno", label: "Dyno", area: "dyno" },
  { href: "/office/customers", label: "Customers", area: "office" },
  { href: "/office/templates", label: "Templates", area: "templates" },
  { href: "/office/parts", label: "Parts", area: "office" },
  { href: "/office/labels", label: "Labels", area: "office" },
  { href: "/office/reminders", label: "Reminders", area: "office" },
  { href: "/come-backs", label: "Come-backs", area: "come-backs" },
  { href: "/office/outbox-mail", label: "E-mail outbox", area: "office" },
  { href: "/office/users", label: "Sign-ins", area: "users" },
  { href: "/calculators", label: "Numbers", area: "calculators" },
  { href: "/my-bikes", label: "My bikes", area: "my-bikes" },
  { href: "/audit", label: "Audit log", area: "audit" },
];

const ROLE_LABEL = { mechanic: "Mechanic", supervisor: "Supervisor", office: "Office", customer: "Customer" } as const;

// The frame around every signed-in page: who you are, where you can go, sign out.
export function AppFrame({
  user,
  current,
  children,
  flush = false,
}: {
  user: SessionUser;
  current: string;
  children: ReactNode;
  flush?: boolean;
}) {
  const links = NAV.filter((n) => canReach(user.role, n.area));
  return (
    <div className="flex min-h-screen flex-col">
      <header className="no-print flex flex-wrap items-center gap-4 bg-steel-900 px-4 py-3 text-white">
        <span className="text-lg font-bold tracking-wide">BENCHTAG</span>
        <nav aria-label="Main" className="flex flex-wrap gap-2">
          {links.map((l) => (
            <Link
              key={l.href}
              href={l.href}
              aria-current={current === l.href ? "page" : undefined}
              className={`flex min-h-12 items-center rounded-lg px-4 text-base font-bold ${current === l.href ? "bg-signal text-ink" : "text-white underline-offset-4 hover:underline"}`}
            >
              {l.label}
              {l.href === "/review" && <ReviewCount />}
            </Link>
          ))}
        </nav>
        <span className="ml-auto text-base" data-testid="whoami">
          {user.name} · {ROLE_LABEL[user.role]}
        </span>
        <SignOutButton />
      </header>
      <main className={flush ? "flex flex-1 flex-col" : "flex-1 px-4 py-6 md:px-8"}>{children}</main>
    </div>
  );
}
