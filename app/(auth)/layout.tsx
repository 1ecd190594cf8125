import { Wordmark } from "@/app/_components/mark";
import { ContrastToggle } from "@/app/_components/contrast-toggle";

export default function AuthLayout({ children }: { children: React.ReactNode }) {
  return (
    <main className="mx-auto flex min-h-screen max-w-md flex-col justify-center px-6 py-12">
      <div className="mb-8 flex flex-wrap items-center justify-between gap-3">
        <Wordmark />
        <ContrastToggle />
      </div>
      {children}
    </main>
  );
}
