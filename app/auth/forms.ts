import { z } from "zod";
import { ROLES } from "~/auth/roles";
import { nameText } from "@shared/text";
import { idSchema, UUID_PATTERN } from "@shared/ids";

// The account forms' rules. Isomorphic, but enforced on the server: every action parses with these.

const email = z
  .string({ error: "Enter your e-mail address." })
  .trim()
  .min(1, "Enter your e-mail address.")
  .max(254, "That e-mail address is too long.")
  .pipe(z.email("Enter a valid e-mail address, like name@example.com."));

// bcrypt reads 72 bytes at most; refusing longer passwords beats cutting them silently.
const newPassword = z
  .string({ error: "Choose a password." })
  .min(10, "Use at least 10 characters.")
  .refine((p) => new TextEncoder().encode(p).length <= 72, "Use at most 72 bytes (72 plain letters, fewer with accents or symbols).");

export const SignUpForm = z.object({
  displayName: nameText("Your name")
    .min(1, "Enter the name other people on Loadline will see.")
    .max(80, "Keep the name under 80 characters."),
  email,
  password: newPassword,
});

export const SignInForm = z.object({
  email,
  password: z.string({ error: "Enter your password." }).min(1, "Enter your password.").max(1024),
});

export const ForgotPasswordForm = z.object({ email });

export const ResetPasswordForm = z
  .object({
    password: newPassword,
    confirm: z.string({ error: "Type the password again." }),
  })
  .refine((v) => v.password === v.confirm, { path: ["confirm"], message: "The two passwords are not the same." });

export const RolesForm = z.object({
  userId: z.string().regex(UUID_PATTERN, "Unknown account."),
  roles: z.array(z.enum(ROLES, "Unknown role.")).default([]),
});

export const StatusForm = z.object({
  userId: z.string().regex(UUID_PATTERN, "Unknown account."),
  status: z.enum(["active", "suspended"], "Unknown status."),
});

// The account page's own forms: a new confirmation link, ending sessions, connecting a payout account.
export const AccountActionForm = z.discriminatedUnion(
  "intent",
  [
    z.object({ intent: z.literal("resend-verification") }),
    z.object({ intent: z.literal("sign-out-session"), sessionId: idSchema("session") }),
    z.object({ intent: z.literal("sign-out-others") }),
    z.object({ intent: z.literal("connect-payouts") }),
  ],
  { error: "Unknown request." },
);

export type FieldErrors = Record<string, string>;

/** First message per field, keyed by the field's name, for showing beside each input. */
export function fieldErrors(error: z.ZodError): FieldErrors {
  const out: FieldErrors = {};
  for (const issue of error.issues) {
    const key = issue.path.join(".") || "form";
    out[key] ??= issue.message;
  }
  return out;
}

/** FormData to a plain object; repeated names (checkbox groups) become arrays. */
export function formObject(form: FormData, arrays: readonly string[] = []): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const key of new Set(form.keys())) {
    const values = form.getAll(key).filter((v): v is string => typeof v === "string");
    out[key] = arrays.includes(key) ? values : values[0];
  }
  for (const key of arrays) out[key] ??= [];
  return out;
}
