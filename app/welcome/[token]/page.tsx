import type { Metadata } from "next";
import { currentUser } from "@/app/_server/session";
import { db } from "@/db/setup/client";
import { checkInvitationLink } from "@/db/customer-contact/invitations";
import { TOKEN_PATTERN } from "@/lib/customer-contact/schemas";
import { judgeLink } from "@/lib/customer-contact/invitation-rules";
import { SetPasswordForm } from "./set-password-form";

export const metadata: Metadata = { title: "Choose your password", referrer: "no-referrer" };

// The page an invitation e-mail links to: whose sign-in the link is for and a form to choose the
// password, or why the link does not work (nothing is changed by opening it).
export default async function WelcomePage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const user = await currentUser();
  const found = TOKEN_PATTERN.test(token)
    ? await checkInvitationLink(db(), token, user?.id ?? null)
    : { verdict: judgeLink(null, new Date(), null), email: null, shopName: null };
  return (
    <main className="mx-auto flex min-h-screen max-w-lg flex-col justify-center px-6 py-12">
      <p className="text-lg font-bold tracking-wide text-steel-700">BENCHTAG{found.shopName ? ` · ${found.shopName}` : ""}</p>
      <h1 className="mt-2 text-4xl font-bold">Choose your password</h1>
      {found.verdict.ok ? (
        <>
          <p className="mt-2 text-lg">
            For the sign-in <span className="font-mono font-bold">{found.email}</span>. You will sign in with this e-mail address and the
            password you choose here.
          </p>
          <SetPasswordForm token={token} />
        </>
      ) : (
        <p
          role="alert"
          data-testid="link-refused"
          className="mt-4 rounded-lg border-2 border-fail bg-fail-light px-4 py-3 text-lg font-bold text-fail"
        >
          ✖ {found.verdict.message}
        </p>
      )}
    </main>
  );
}
