import { requirePageViewer } from "@/lib/server/access";
import { AppHeader, SkipLink } from "@/app/_components/app-header";

export default async function AppLayout({ children }: { children: React.ReactNode }) {
  const viewer = await requirePageViewer();
  return (
    <>
      <SkipLink />
      <AppHeader viewer={viewer} />
      <main id="main" tabIndex={-1} className="mx-auto max-w-6xl px-4 py-6 outline-none sm:px-6 sm:py-8">
        {children}
      </main>
    </>
  );
}
