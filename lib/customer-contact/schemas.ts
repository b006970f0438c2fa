import { z } from "zod";
import { newPassword } from "@/lib/auth/password-rule";
import { safeText } from "@/lib/safe-values";

// What the customer and the office send about a job: setting a password from an invitation,
// a message on the job's thread, a progress update with photos.

/** The token in an invitation link: 43 characters of base64url (32 random bytes). */
export const TOKEN_PATTERN = /^[A-Za-z0-9_-]{43}$/;

export const setPasswordSchema = z
  .object({
    token: z.string({ error: "the link is incomplete" }).regex(TOKEN_PATTERN, "the link is incomplete: open it from the e-mail again"),
    password: newPassword,
    repeat: z.string({ error: "type the password again" }),
  })
  .strict()
  .superRefine((v, ctx) => {
    if (v.password !== v.repeat) ctx.addIssue({ code: "custom", path: ["repeat"], message: "the two passwords differ" });
  });

export const MESSAGE_MAX = 4000;
export const messageSchema = z.object({ body: safeText({ label: "Message", max: MESSAGE_MAX, min: 1, multiline: true }) }).strict();

export const PROGRESS_NOTE_MAX = 2000;
export const PROGRESS_PHOTOS_MAX = 12;
export const progressUpdateSchema = z
  .object({
    note: safeText({ label: "Note to the customer", max: PROGRESS_NOTE_MAX, min: 1, multiline: true }),
    photoIds: z
      .array(z.uuid("choose photos of this job"), { error: "choose photos of this job" })
      .max(PROGRESS_PHOTOS_MAX, `Photos: at most ${PROGRESS_PHOTOS_MAX} in one update.`)
      .refine((ids) => new Set(ids).size === ids.length, "Photos: each photo once."),
  })
  .strict();
