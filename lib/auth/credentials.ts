import { z } from "zod";

/**
 * The longest e-mail address Benchtag keeps (a customer's, a sign-in's). Longer than any real one,
 * and short enough for the database's unique index on sign-ins (a key past about 2.7 kB fails it).
 */
export const EMAIL_MAX_CHARS = 200;

const NOT_A_SIGN_IN_ADDRESS = "Enter the e-mail address you sign in with";

export const credentialsSchema = z.object({
  // an address longer than any sign-in's belongs to nobody: the same words as a mistyped one
  email: z.string().trim().toLowerCase().max(EMAIL_MAX_CHARS, NOT_A_SIGN_IN_ADDRESS).email(NOT_A_SIGN_IN_ADDRESS),
  password: z.string().min(1, "Enter your password").max(200, "Password is too long"),
});
