import { NextResponse } from "next/server";
import { currentUser } from "@/app/_server/session";

// Who am I: the signed-in user's id, name and role (401 when signed out).
export async function GET() {
  const user = await currentUser();
  if (!user) return NextResponse.json({ error: "Sign in first." }, { status: 401 });
  return NextResponse.json({ id: user.id, name: user.name, role: user.role });
}
