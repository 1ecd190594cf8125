import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { requirePageViewer } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { getAuditById } from "@/db/queries/audits";
import { MapLoader } from "@/app/_components/map/map-loader";
import { idFromParams } from "@/lib/validation/ids";

export const metadata: Metadata = { title: "Audit map" };

export default async function AuditMapPage({ params }: { params: Promise<{ auditId: string }> }) {
  const viewer = await requirePageViewer();
  // The audit layout answers 404 for a malformed id or another organisation's audit (with the status code); the
  // page may render alongside it, so it checks again rather than assume.
  const auditId = idFromParams(await params, "auditId") ?? notFound();
  const audit = await getAuditById(await getDb(), { id: auditId, orgId: viewer.orgId });
  if (!audit) notFound();
  return (
    <div className="grid gap-4" data-testid="audit-map-page">
      <header>
        <p className="text-sm text-ink-soft">
          <Link href={`/fields/${audit.field.id}`} className="font-medium text-leaf underline-offset-2 hover:underline">
            {audit.field.name}
          </Link>
          {" · "}
          <Link href={`/audits/${audit.id}`} className="font-medium text-leaf underline-offset-2 hover:underline">
            audit result
          </Link>
          {" · "}
          <Link
            href={`/fields/${audit.field.id}/map`}
            className="font-medium text-leaf underline-offset-2 hover:underline"
          >
            field map (what the grower sees)
          </Link>
        </p>
        <h1 className="text-xl font-semibold tracking-tight">Map: {audit.title}</h1>
        <p className="mt-1 text-sm text-ink-soft">
          Each checkpoint where its record says the plant is, coloured by how far the survey found it from there. Tap or
          click a plant for its full record; with a mouse, point at one for a summary. On a keyboard, “Next out of
          tolerance” steps through the worst plants.
        </p>
      </header>
      <MapLoader auditId={audit.id} mode="audit" />
    </div>
  );
}
