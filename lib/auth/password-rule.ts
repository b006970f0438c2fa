import { z } from "zod";

// The one rule for a password someone chooses (the office giving a first password, a customer
// setting theirs from an invitation): 10 to 200 characters.
export const PASSWORD_MIN = 10;
export const PASSWORD_MAX = 200;

export const newPassword = z
  .string({ error: "enter a password" })
  .min(PASSWORD_MIN, `at least ${PASSWORD_MIN} characters`)
  .max(PASSWORD_MAX, `at most ${PASSWORD_MAX} characters`);
