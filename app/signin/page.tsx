import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { homePathFor } from "@/lib/auth/roles";
import { currentUser } from "../_server/session";
import { SignInForm } from "./sign-in-form";

export const metadata: Metadata = { title: "Sign in" };

export default async function SignInPage({ searchParams }: { searchParams: Promise<{ ended?: string }> }) {
  const { ended } = await searchParams;
  const user = await currentUser();
  if (user) redirect(homePathFor(user.role));
  return (
    <main className="mx-auto flex min-h-screen max-w-lg flex-col justify-center px-6 py-12">
      <p className="text-lg font-bold tracking-wide text-steel-700">BENCHTAG</p>
      <h1 className="mt-2 text-4xl font-bold">Sign in</h1>
      <p className="mt-2 text-lg text-steel-700">Workshop records from intake to handover.</p>
      {ended === "1" && (
        <p data-testid="ended-notice" className="mt-4 rounded-lg border-2 border-steel-700 bg-white px-4 py-3 text-lg font-bold">
          The office ended your session on this tablet. Its work not yet sent was handed to the office, and the tablet was cleared.
        </p>
      )}
      <SignInForm />
    </main>
  );
}
