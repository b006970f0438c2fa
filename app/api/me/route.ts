import { route } from "@/app/_server/route";

// Who am I: the signed-in user's id, name and role (401 when signed out).
export const GET = route({ access: { signedIn: true } }, async ({ user }) => ({ id: user.id, name: user.name, role: user.role }));
