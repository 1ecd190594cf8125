"use server";
import { headers } from "next/headers";
import { redirect } from "next/navigation";
import { z } from "zod";
import { PASSWORD_MIN, fieldErrors } from "@/lib/validation/account";
import { acceptSignedIn, acceptWithNewAccount, acceptWithSignIn, type AcceptResult } from "./accept";

export interface InviteState {
  errors: Record<string, string>;
  formError?: string;
  name?: string;
}

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

function outcome(r: AcceptResult, name?: string): InviteState {
  if (r.ok) redirect("/");
  return { errors: r.errors ?? {}, formError: r.formError, name };
}

/** Public by nature (the invitee has no account yet): the invitation link is the proof of the e-mail address. */
export async function acceptNewAccountAction(_prev: InviteState, formData: FormData): Promise<InviteState> {
  const parsed = NewAccount.safeParse(Object.fromEntries(formData));
  if (!parsed.success) return { errors: fieldErrors(parsed.error), name: String(formData.get("name") ?? "") };
  const { invitationId, name, password } = parsed.data;
  return outcome(await acceptWithNewAccount(invitationId, { name, password }, await headers()), name);
}

export async function acceptSignInAction(_prev: InviteState, formData: FormData): Promise<InviteState> {
  const parsed = SignIn.safeParse(Object.fromEntries(formData));
  if (!parsed.success) return { errors: fieldErrors(parsed.error) };
  return outcome(await acceptWithSignIn(parsed.data.invitationId, { password: parsed.data.password }, await headers()));
}

export async function acceptSignedInAction(_prev: InviteState, formData: FormData): Promise<InviteState> {
  const parsed = SignedIn.safeParse(Object.fromEntries(formData));
  if (!parsed.success) return { errors: {}, formError: "This invitation link is incomplete." };
  return outcome(await acceptSignedIn(parsed.data.invitationId, await headers()));
}
