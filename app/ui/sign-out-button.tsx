"use client";

import { signOut } from "next-auth/react";

export function SignOutButton() {
  return (
    <button
      type="button"
      onClick={() => signOut({ callbackUrl: "/signin" })}
      className="min-h-12 rounded-lg border-2 border-white px-4 text-base font-bold text-white"
    >
      Sign out
    </button>
  );
}
