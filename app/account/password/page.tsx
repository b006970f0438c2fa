import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { currentUser } from "@/app/_server/session";
import { AppFrame } from "@/app/ui/app-frame";
import { ChangePasswordForm } from "./change-password-form";

export const metadata: Metadata = { title: "Change your password" };

// Anyone signed in changes their own password here (POST /api/me/password).
export default async function ChangePasswordPage() {
  const user = await currentUser();
  if (!user) redirect("/signin");
  return (
    <AppFrame user={user} current="/account/password">
      <div className="mx-auto max-w-lg">
        <h1 className="text-3xl font-bold">Change your password</h1>
        <p className="mt-2 text-lg">
          Type the password you have now, then the new one twice. You stay signed in here; everywhere else you are signed in as{" "}
          <span className="font-bold">{user.name}</span> (another computer, a tablet) signs out and must sign in with the new password.
        </p>
        <ChangePasswordForm />
      </div>
    </AppFrame>
  );
}
