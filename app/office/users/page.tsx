import type { Metadata } from "next";
import { requirePageArea } from "@/app/_server/session";
import { AppFrame } from "@/app/ui/app-frame";
import { db } from "@/db/setup/client";
import { listCustomers } from "@/db/shop/customers";
import { listShopUsers } from "@/db/shop/users";
import { signInWaitRows } from "@/app/_server/sign-in-waits";
import { listOutboxHandovers } from "@/db/auth/outbox-handovers";
import { listOpenSessions } from "@/db/auth/sessions";
import { ActiveToggle } from "./_components/active-toggle";
import { HandedOver, OpenSessions, SignInWaits } from "./_components/session-sections";
import { UserForm } from "./_components/user-form";
import { PostButton } from "./_components/post-button";
import { latestInvitations } from "@/db/customer-contact/invitations";
import { formatDayTime } from "@/lib/format/dates";

export const metadata: Metadata = { title: "Sign-ins" };

const ROLE_LABELS = { mechanic: "Mechanic", supervisor: "Supervisor", office: "Office", customer: "Customer" } as const;

export default async function UsersPage() {
  const user = await requirePageArea("users");
  const [users, customers, sessions, handovers, waits, invitations] = await Promise.all([
    listShopUsers(db(), user.shopId),
    listCustomers(db(), user.shopId),
    listOpenSessions(db(), user.shopId),
    listOutboxHandovers(db(), user.shopId),
    signInWaitRows(db(), user.shopId),
    latestInvitations(db(), user.shopId),
  ]);
  return (
    <AppFrame user={user} current="/office/users">
      <h1 className="text-3xl font-bold">Sign-ins</h1>
      <p className="mt-2 text-lg text-steel-700">Who can sign in to this shop, and as what.</p>
      <table className="mt-6 w-full border-collapse text-left text-lg" data-testid="users-table">
        <thead>
          <tr className="border-b-2 border-steel-700">
            <th className="py-2 pr-4">Name</th>
            <th className="py-2 pr-4">E-mail</th>
            <th className="py-2 pr-4">Role</th>
            <th className="py-2 pr-4">Status</th>
            <th className="py-2 pr-4">
              <span className="sr-only">Change</span>
            </th>
          </tr>
        </thead>
        <tbody>
          {users.map((u) => (
            <tr key={u.id} className="border-b border-steel-300" data-testid="user-row">
              <td className="py-2 pr-4">{u.name}</td>
              <td className="py-2 pr-4 font-mono text-base">{u.email}</td>
              <td className="py-2 pr-4">
                {ROLE_LABELS[u.role]}
                {u.customerName ? ` (${u.customerName})` : ""}
              </td>
              <td className="py-2 pr-4">
                <span className="font-bold">{u.active ? "Active" : "Turned off"}</span>
                {u.role === "customer" && <InvitationState invitation={invitations.get(u.id)} />}
              </td>
              <td className="py-2 pr-4">
                <div className="flex flex-wrap gap-4">
                  {u.id !== user.id && <ActiveToggle userId={u.id} active={u.active} name={u.name} />}
                  {u.role === "customer" && u.active && (
                    <PostButton
                      url={`/api/office/users/${u.id}/invitation`}
                      body={undefined}
                      label={invitations.has(u.id) ? "Send a new invitation" : "Send an invitation"}
                      ariaLabel={`Send ${u.name} an invitation`}
                    />
                  )}
                </div>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      <OpenSessions sessions={sessions} />
      <SignInWaits waits={waits} />
      <HandedOver handovers={handovers} />
      <section className="mt-8 rounded-xl border-2 border-steel-300 bg-white p-4">
        <h2 className="text-xl font-bold">Give someone a sign-in</h2>
        <div className="mt-4">
          <UserForm customers={customers.map((c) => ({ id: c.id, name: c.name }))} />
        </div>
      </section>
    </AppFrame>
  );
}

/** Where a customer's newest invitation stands, in words (and a mark, not colour alone). */
function InvitationState({ invitation }: { invitation: ReturnType<Awaited<ReturnType<typeof latestInvitations>>["get"]> }) {
  const line = !invitation
    ? "No invitation sent"
    : invitation.usedAt
      ? `✔ Password set ${formatDayTime(invitation.usedAt)}`
      : !invitation.expiresAt
        ? `◷ Invitation of ${formatDayTime(invitation.invitedAt)} waiting to be e-mailed`
        : invitation.expiresAt.getTime() <= Date.now()
          ? `✖ Invitation expired ${formatDayTime(invitation.expiresAt)}`
          : `◷ Invited; the link works until ${formatDayTime(invitation.expiresAt)}`;
  return (
    <span className="block text-base" data-testid="invitation-state">
      {line}
    </span>
  );
}
