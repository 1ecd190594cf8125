"use server";
import { headers } from "next/headers";
import { redirect } from "next/navigation";
import { isAPIError } from "better-auth/api";
import { SignUpInput, fieldErrors } from "@/lib/validation/account";
import { createAccountWithOrganisation, signUpOpen } from "@/lib/server/onboarding";

export interface SignUpState {
  errors: Record<string, string>;
  formError?: string;
  values?: Record<string, string>;
}

const INVITATION_ONLY = "Plotproof accounts are made by invitation: ask your organisation's owner to invite you.";

/** Public by nature (there is no session yet): creates the account and its organisation, then signs in. */
export async function signUpAction(_prev: SignUpState, formData: FormData): Promise<SignUpState> {
  const raw = Object.fromEntries(formData) as Record<string, string>;
  const { password: _pw, ...values } = raw;
  if (!(await signUpOpen())) return { errors: {}, formError: INVITATION_ONLY, values };
  const parsed = SignUpInput.safeParse(raw);
  if (!parsed.success) return { errors: fieldErrors(parsed.error), values };
  try {
    await createAccountWithOrganisation(parsed.data, await headers());
  } catch (err) {
    if (isAPIError(err) && String(err.body?.code ?? "").startsWith("USER_ALREADY_EXISTS")) {
      return { errors: { email: "An account with this e-mail already exists. Sign in instead." }, values };
    }
    if (isAPIError(err) && err.body?.code === "PASSWORD_TOO_SHORT") {
      return { errors: { password: "Use at least 10 characters." }, values };
    }
    console.error("[plotproof] sign-up failed", err);
    return { errors: {}, formError: "We could not create your account. Nothing was saved; try again.", values };
  }
  redirect("/");
}
