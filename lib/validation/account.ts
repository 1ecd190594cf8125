import { z } from "zod";

export const PASSWORD_MIN = 10;

export const SignInInput = z.object({
  email: z.email("Enter a valid e-mail address, e.g. name@farm.example."),
  password: z.string().min(1, "Enter your password."),
});

export const SignUpInput = z.object({
  name: z.string().trim().min(1, "Enter your name.").max(100),
  email: z.email("Enter a valid e-mail address, e.g. name@farm.example."),
  password: z
    .string()
    .min(PASSWORD_MIN, `Use at least ${PASSWORD_MIN} characters.`)
    .max(128, "Use at most 128 characters."),
  organisation: z.string().trim().min(2, "Name your farm business or contracting company.").max(120),
  kind: z.enum(["farm", "contractor"], { message: "Choose farm business or field-services contractor." }),
});
export type SignUpInput = z.infer<typeof SignUpInput>;

/** zod issues → { field: first message } for forms. */
export function fieldErrors(error: z.ZodError): Record<string, string> {
  const out: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = String(issue.path[0] ?? "form");
    out[key] ??= issue.message;
  }
  return out;
}
