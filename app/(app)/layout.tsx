import { requirePageViewer } from "@/lib/server/access";
import { AppHeader } from "@/app/_components/app-header";

export default async function AppLayout({ children }: { children: React.ReactNode }) {
  const viewer = await requirePageViewer();
  return (
    <>
      <AppHeader viewer={viewer} />
      <main className="mx-auto max-w-6xl px-6 py-8">{children}</main>
    </>
  );
}
