import { redirect } from "next/navigation";
import { currentUser } from "./_server/session";
import { homePathFor } from "@/lib/auth/roles";

export default async function Home() {
  const user = await currentUser();
  redirect(user ? homePathFor(user.role) : "/signin");
}
