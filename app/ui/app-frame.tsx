import Link from "next/link";
import type { ReactNode } from "react";
import { canReach, type Area } from "@/lib/auth/roles";
import type { SessionUser } from "@/lib/auth/session-user";
import { ReviewCount } from "./review-count";
import { SignOutButton } from "./sign-out-button";

// `row`: shown in the header's row; the others are under "More" (one click, no hover), so the
// header stays one row at 1024 px whatever the role reaches.
const NAV: Array<{ href: string; label: string; area: Area; row: boolean }> = [
  { href: "/bench", label: "Bench", area: "bench", row: true },
  { href: "/review", label: "Review", area: "review", row: true },
  { href: "/office", label: "Work orders", area: "office", row: true },
  { href: "/dyno", label: "Dyno", area: "dyno", row: false },
  { href: "/office/customers", label: "Customers", area: "office", row: true },
  { href: "/office/templates", label: "Templates", area: "templates", row: false },
  { href: "/office/parts", label: "Parts", area: "office", row: true },
  { href: "/office/stock", label: "Stock", area: "office", row: false },
  { href: "/office/labels", label: "Labels", area: "office", row: false },
  { href: "/office/calendar", label: "Week plan", area: "office", row: false },
  { href: "/office/reminders", label: "Reminders", area: "office", row: false },
  { href: "/come-backs", label: "Come-backs", area: "come-backs", row: false },
  { href: "/office/outbox-mail", label: "E-mail outbox", area: "office", row: false },
  { href: "/office/users", label: "Sign-ins", area: "users", row: false },
  { href: "/calculators", label: "Numbers", area: "calculators", row: false },
  { href: "/my-bikes", label: "My bikes", area: "my-bikes", row: true },
  { href: "/audit", label: "Audit log", area: "audit", row: false },
];

/** At most this many links go under "More" before it is worth having; fewer stay in the row. */
const MORE_AT_LEAST = 3;

const ROLE_LABEL = { mechanic: "Mechanic", supervisor: "Supervisor", office: "Office", customer: "Customer" } as const;

function NavLink({ link, current }: { link: (typeof NAV)[number]; current: string }) {
  const here = current === link.href;
  return (
    <Link
      href={link.href}
      aria-current={here ? "page" : undefined}
      className={`flex min-h-12 items-center whitespace-nowrap rounded-lg px-3 text-base font-bold ${here ? "bg-signal text-ink" : "text-white underline-offset-4 hover:underline"}`}
    >
      {link.label}
      {link.href === "/review" && <ReviewCount />}
    </Link>
  );
}

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
  const spare = links.filter((l) => !l.row);
  const more = spare.length >= MORE_AT_LEAST ? spare : [];
  const row = links.filter((l) => !more.includes(l));
  const hereInMore = more.some((l) => l.href === current);
  return (
    <div className="flex min-h-screen flex-col">
      <header className="no-print flex flex-wrap items-center gap-x-3 gap-y-2 bg-steel-900 px-4 py-2 text-white">
        <span className="text-lg font-bold tracking-wide">BENCHTAG</span>
        <nav aria-label="Main" className="flex flex-wrap items-center gap-1">
          {row.map((l) => (
            <NavLink key={l.href} link={l} current={current} />
          ))}
          {more.length > 0 && (
            <details className="relative">
              <summary
                className={`flex min-h-12 cursor-pointer list-none items-center rounded-lg border-2 border-white/60 px-3 text-base font-bold ${hereInMore ? "bg-signal text-ink" : ""}`}
              >
                More <span aria-hidden="true">&nbsp;▾</span>
              </summary>
              <div className="absolute left-0 top-full z-20 mt-1 flex min-w-56 flex-col gap-1 rounded-lg border-2 border-white bg-steel-900 p-2 shadow-lg">
                {more.map((l) => (
                  <NavLink key={l.href} link={l} current={current} />
                ))}
              </div>
            </details>
          )}
        </nav>
        <span className="ml-auto flex items-center gap-3">
          <span className="whitespace-nowrap text-base" data-testid="whoami" title={ROLE_LABEL[user.role]}>
            {user.name} · {ROLE_LABEL[user.role]}
          </span>
          <a
            href="/account/password"
            aria-current={current === "/account/password" ? "page" : undefined}
            className="flex min-h-12 items-center whitespace-nowrap rounded-lg px-2 text-base underline"
          >
            Password
          </a>
          <SignOutButton />
        </span>
      </header>
      <main className={flush ? "flex flex-1 flex-col" : "flex-1 px-4 py-6 md:px-8"}>{children}</main>
    </div>
  );
}
