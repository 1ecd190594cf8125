import "server-only";
import { z } from "zod";
import { PASSWORD_MIN, fieldErrors } from "@/lib/validation/account";
import { type AcceptResult, acceptSignedIn, acceptWithNewAccount, acceptWithSignIn } from "./accept";

/** What an invitation form shows again after a refused submission. */
export interface InviteState {
  errors: Record<string, string>;
  formError?: string;
  name?: string;
}

/** A submitted invitation form: accepted (the caller sends the new member in), or the state to show again. */
export type InviteSubmission = { accepted: true } | { accepted: false; state: InviteState };

const NewAccount = z
  .object({
    invitationId: z.string().min(1).max(100),
    name: z.string().trim().min(1, "Enter your name.").max(100),
    password: z
      .string()
      .min(PASSWORD_MIN, `Use at least ${PASSWORD_MIN} characters.`)
      .max(128, "Use at most 128 characters."),
    confirm: z.string(),
  })
  .refine((v) => v.password === v.confirm, { path: ["confirm"], message: "The two passwords differ." });

const SignIn = z.object({
  invitationId: z.string().min(1).max(100),
  password: z.string().min(1, "Enter your password."),
});
const SignedIn = z.object({ invitationId: z.string().min(1).max(100) });

function outcome(r: AcceptResult, name?: string): InviteSubmission {
  if (r.ok) return { accepted: true };
  return { accepted: false, state: { errors: r.errors ?? {}, formError: r.formError, name } };
}

/** Public by nature (the invitee has no account yet): the invitation link is the proof of the e-mail address. */
export async function submitNewAccount(formData: FormData, requestHeaders: Headers): Promise<InviteSubmission> {
  const parsed = NewAccount.safeParse(Object.fromEntries(formData));
  if (!parsed.success)
    return {
      accepted: false,
      state: { errors: fieldErrors(parsed.error), name: String(formData.get("name") ?? "") },
    };
  const { invitationId, name, password } = parsed.data;
  return outcome(await acceptWithNewAccount(invitationId, { name, password }, requestHeaders), name);
}

/** An invitee with an account signs in with its password on the invitation page. */
export async function submitSignIn(formData: FormData, requestHeaders: Headers): Promise<InviteSubmission> {
  const parsed = SignIn.safeParse(Object.fromEntries(formData));
  if (!parsed.success) return { accepted: false, state: { errors: fieldErrors(parsed.error) } };
  return outcome(await acceptWithSignIn(parsed.data.invitationId, { password: parsed.data.password }, requestHeaders));
}

/** Someone already signed in as the invited address. */
export async function submitSignedIn(formData: FormData, requestHeaders: Headers): Promise<InviteSubmission> {
  const parsed = SignedIn.safeParse(Object.fromEntries(formData));
  if (!parsed.success)
    return { accepted: false, state: { errors: {}, formError: "This invitation link is incomplete." } };
  return outcome(await acceptSignedIn(parsed.data.invitationId, requestHeaders));
}
