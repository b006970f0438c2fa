import { z } from "zod";
import { EMAIL_MAX_CHARS } from "@/lib/auth/credentials";
import { newPassword } from "@/lib/auth/password-rule";
import { ROLES } from "@/lib/auth/roles";

// A sign-in for someone in the shop. A customer's sign-in is tied to their customer record, so they
// see only their own bikes; staff sign-ins are tied to none.
export const newUserSchema = z
  .object({
    name: z.string().trim().min(2, "give the person's name").max(120),
    email: z
      .string()
      .trim()
      .toLowerCase()
      .max(EMAIL_MAX_CHARS, `at most ${EMAIL_MAX_CHARS} characters`)
      .email("enter an e-mail address they can sign in with"),
    role: z.enum(ROLES, { error: "choose a role" }),
    // A customer's sign-in may be made without one: they get an invitation e-mail to set their own.
    password: z
      .string({ error: "enter a password" })
      .optional()
      .transform((v) => v || null),
    customerId: z.union([z.uuid("choose the customer"), z.literal(""), z.null()]).transform((v) => v || null),
  })
  .superRefine((u, ctx) => {
    const password = u.password === null && u.role === "customer" ? null : newPassword.safeParse(u.password ?? "");
    if (password && !password.success) ctx.addIssue({ code: "custom", path: ["password"], message: password.error.issues[0].message });
    if (u.role === "customer" && !u.customerId)
      ctx.addIssue({ code: "custom", path: ["customerId"], message: "a customer sign-in needs the customer it belongs to" });
    if (u.role !== "customer" && u.customerId)
      ctx.addIssue({ code: "custom", path: ["customerId"], message: "only customer sign-ins belong to a customer" });
  });

export const userActiveSchema = z.object({ active: z.boolean({ error: "say whether the sign-in is active" }) }).strict();
