import { z } from "zod";

export const credentialsSchema = z.object({
  email: z.string().trim().toLowerCase().email("Enter the e-mail address you sign in with"),
  password: z.string().min(1, "Enter your password").max(200, "Password is too long"),
});

// Sign-in rate limit: failed attempts allowed inside the window, per e-mail address and per
// client address (higher, since several people may share one workshop connection).
export const SIGN_IN_LIMIT = { maxFailuresPerEmail: 5, maxFailuresPerAddress: 30, windowMinutes: 15 } as const;
