import { json, route } from "@/app/_server/route";
import { requestClientAddress } from "@/app/_server/client-address";
import { changeOwnPassword } from "@/app/_server/password-change";
import { CHANGE_PASSWORD_LABELS, changePasswordSchema } from "@/lib/auth/password-change-schema";

// POST: the signed-in person changes their own password (current, new, new again). Their other
// sessions end; this one stays. A wrong current password counts as a wrong password at sign-in.
export const POST = route(
  { access: { signedIn: true }, body: json(changePasswordSchema, { maxBytes: 8 * 1024, labels: CHANGE_PASSWORD_LABELS }) },
  async ({ req, user, body, db, sessionId }) => {
    const done = await changeOwnPassword(
      db,
      { userId: user.id, sessionId },
      { current: body.current, password: body.password },
      { address: requestClientAddress(req.headers), userAgent: req.headers.get("user-agent") ?? "" },
    );
    return { changed: true, otherSessionsEnded: done.sessionsEnded };
  },
);
