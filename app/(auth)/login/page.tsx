import type { Metadata } from "next";
import Link from "next/link";
import { LoginForm } from "./login-form";

export const metadata: Metadata = { title: "Sign in" };

export default async function LoginPage({ searchParams }: { searchParams: Promise<{ next?: string }> }) {
  const { next } = await searchParams;
  // Only paths inside Plotproof, so a link cannot send people elsewhere after signing in.
  const target = typeof next === "string" && next.startsWith("/") && !next.startsWith("//") ? next : "/";
  return (
    <>
      <h1 className="mb-6 text-xl font-semibold">Sign in</h1>
      <LoginForm next={target} />
      <p className="mt-4 text-sm">
        <Link href="/reset-password" className="font-medium text-leaf hover:underline">
          Forgot your password?
        </Link>
      </p>
      <p className="mt-6 text-sm text-ink-soft">
        New to Plotproof?{" "}
        <Link href="/signup" className="font-medium text-leaf hover:underline">
          Set up your organisation
        </Link>
      </p>
    </>
  );
}
