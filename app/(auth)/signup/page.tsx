import type { Metadata } from "next";
import Link from "next/link";
import { SignUpForm } from "./signup-form";

export const metadata: Metadata = { title: "Set up your organisation" };

export default function SignUpPage() {
  return (
    <>
      <h1 className="mb-2 text-xl font-semibold">Set up your organisation</h1>
      <p className="mb-6 text-sm text-ink-soft">
        You become its owner and can invite QA leads, technicians and growers.
      </p>
      <SignUpForm />
      <p className="mt-6 text-sm text-ink-soft">
        Already have an account?{" "}
        <Link href="/login" className="font-medium text-leaf hover:underline">
          Sign in
        </Link>
      </p>
    </>
  );
}
