import { z } from "zod";
import { PASSWORD_MAX, passwordProblem } from "@/lib/password";
import { cleanText } from "./text";

export const emailSchema = z
  .string({ error: "Enter your e-mail address." })
  .trim()
  .min(1, "Enter your e-mail address.")
  .max(254, "That e-mail address is too long.")
  .toLowerCase()
  .pipe(z.email({ error: "Enter a valid e-mail address, like name@example.com." }));

export const signUpSchema = z
  .object({
    email: emailSchema,
    password: z.string({ error: "Choose a password." }).superRefine((p, ctx) => {
      const problem = passwordProblem(p);
      if (problem) ctx.addIssue({ code: "custom", message: problem });
    }),
    name: cleanText(z.string({ error: "Enter your name." }).trim().min(1, "Enter your name.").max(100, "Use at most 100 characters."), "Name"),
  })
  .superRefine((v, ctx) => {
    const problem = passwordProblem(v.password, v.email);
    // Length and variety were checked on the field; this adds the one rule that needs the e-mail.
    if (problem && !passwordProblem(v.password)) ctx.addIssue({ code: "custom", path: ["password"], message: problem });
  });
export type SignUpInput = z.infer<typeof signUpSchema>;

export const signInSchema = z.object({
  email: emailSchema,
  // Over-long passwords are refused before the KDF runs, so they cannot be used to burn CPU.
  password: z.string({ error: "Enter your password." }).min(1, "Enter your password.").max(PASSWORD_MAX, `Passwords have at most ${PASSWORD_MAX} characters.`),
});
export type SignInInput = z.infer<typeof signInSchema>;

const newPassword = (required: string) =>
  z.string({ error: required }).superRefine((p, ctx) => {
    const problem = passwordProblem(p);
    if (problem) ctx.addIssue({ code: "custom", message: problem });
  });

/** Change password (signed in): the current password proves it is the owner. The route adds the e-mail rule. */
export const changePasswordSchema = z.object({
  currentPassword: z
    .string({ error: "Enter your current password." })
    .min(1, "Enter your current password.")
    .max(PASSWORD_MAX, `Passwords have at most ${PASSWORD_MAX} characters.`),
  newPassword: newPassword("Choose a new password."),
});

export const passwordResetRequestSchema = z.object({ email: emailSchema });

/** A reset token is 32 random bytes in base64url (43 characters). */
export const passwordResetSchema = z.object({
  token: z
    .string({ error: "The reset link is incomplete." })
    .regex(/^[A-Za-z0-9_-]{43}$/, "The reset link is incomplete. Open the whole link from the e-mail."),
  password: newPassword("Choose a new password."),
});

/** POST /api/auth/verify-email: the token from the confirmation link. */
export const verifyEmailSchema = z
  .object({
    token: z
      .string({ error: "The confirmation token is missing." })
      .trim()
      .min(1, "The confirmation token is missing.")
      .max(200, "The confirmation token is not valid."),
  })
  .strict();
