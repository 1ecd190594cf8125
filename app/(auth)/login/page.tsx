import type { Metadata } from "next";
import Link from "next/link";
import { LoginForm } from "./login-form";

export const metadata: Metadata = { title: "Sign in" };

export default function LoginPage() {
  return (
    <>
      <h1 className="mb-6 text-xl font-semibold">Sign in</h1>
      <LoginForm />
      <p className="mt-6 text-sm text-ink-soft">
        New to Plotproof? <Link href="/signup" className="font-medium text-leaf hover:underline">Set up your organisation</Link>
      </p>
    </>
  );
}
