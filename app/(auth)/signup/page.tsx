import type { Metadata } from "next";
import Link from "next/link";
import { signUpOpen } from "@/lib/server/onboarding";
import { SignUpForm } from "./signup-form";

export const metadata: Metadata = { title: "Set up your organisation" };
// Whether sign-up is open depends on the database, so the page is never prerendered.
export const dynamic = "force-dynamic";

export default async function SignUpPage() {
  if (!(await signUpOpen())) {
    return (
      <>
        <h1 className="mb-2 text-xl font-semibold">Accounts are by invitation</h1>
        <p className="mb-6 text-sm text-ink-soft" data-testid="signup-closed">
          Plotproof accounts on this installation are made by invitation. Ask your organisation&apos;s owner to invite
          you; the e-mail has a link to set your password.
        </p>
        <SignInLink />
      </>
    );
  }
  return (
    <>
      <h1 className="mb-2 text-xl font-semibold">Set up your organisation</h1>
      <p className="mb-6 text-sm text-ink-soft">
        You become its owner and can invite QA leads, technicians and growers.
      </p>
      <SignUpForm />
      <SignInLink className="mt-6" />
    </>
  );
}

function SignInLink({ className = "" }: { className?: string }) {
  return (
    <p className={`${className} text-sm text-ink-soft`}>
      Already have an account?{" "}
      <Link href="/login" className="font-medium text-leaf hover:underline">
        Sign in
      </Link>
    </p>
  );
}
