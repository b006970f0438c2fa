import { z } from "zod";

export const credentialsSchema = z.object({
  email: z.string().trim().toLowerCase().email("Enter the e-mail address you sign in with"),
  password: z.string().min(1, "Enter your password").max(200, "Password is too long"),
});
