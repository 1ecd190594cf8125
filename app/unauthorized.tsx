import Link from "next/link";
import { Wordmark } from "./_components/mark";

export default function Unauthorized() {
  return (
    <main className="mx-auto max-w-lg px-6 py-20">
      <Wordmark />
      <h1 className="mt-8 text-xl font-semibold">Sign in to continue</h1>
      <Link href="/login" className="mt-6 inline-block font-medium text-leaf hover:underline">
        Sign in
      </Link>
    </main>
  );
}
