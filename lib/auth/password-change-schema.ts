import { z } from "zod";
import { newPassword, PASSWORD_MAX } from "./password-rule";

/** Changing one's own password: the current one, the new one and the new one again. */
export const changePasswordSchema = z
  .object({
    current: z
      .string({ error: "enter your current password" })
      .min(1, "enter your current password")
      .max(PASSWORD_MAX, `at most ${PASSWORD_MAX} characters`),
    password: newPassword,
    repeat: z.string({ error: "type the new password again" }).max(PASSWORD_MAX, `at most ${PASSWORD_MAX} characters`),
  })
  .strict()
  .superRefine((v, ctx) => {
    if (v.password !== v.repeat) ctx.addIssue({ code: "custom", path: ["repeat"], message: "the two new passwords differ" });
  });

export const CHANGE_PASSWORD_LABELS = { current: "Current password", password: "New password", repeat: "New password again" } as const;
