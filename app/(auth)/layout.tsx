import { Wordmark } from "@/app/_components/mark";

export default function AuthLayout({ children }: { children: React.ReactNode }) {
  return (
    <main className="mx-auto flex min-h-screen max-w-md flex-col justify-center px-6 py-12">
      <div className="mb-8">
        <Wordmark />
      </div>
      {children}
    </main>
  );
}
