import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { requirePageViewer } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { getAuditById } from "@/db/queries/audits";
import { getAuditForReview } from "@/db/queries/review";
import { listDatasets } from "@/db/queries/datasets";
import { listProfiles } from "@/db/queries/profiles";
import { can } from "@/lib/roles";
import { idFromParams } from "@/lib/validation/ids";
import { tightestLimit } from "@/lib/review/checklist";
import { surveyPrecision } from "@/lib/server/review/review-service";
import { ReviewBar } from "@/app/_components/review/review-bar";
import { PageTitle, RevisionTag } from "@/app/_components/ui";
import { ReviewWorkspace } from "./review-workspace";

export const metadata: Metadata = { title: "Review and sign-off" };

// The audit layout has already answered 404 for another organisation's audit.
export default async function ReviewPage({ params }: { params: Promise<{ auditId: string }> }) {
  const viewer = await requirePageViewer();
  const auditId = idFromParams(await params, "auditId") ?? notFound();
  const db = await getDb();
  const [audit, row] = await Promise.all([
    getAuditById(db, { id: auditId, orgId: viewer.orgId }),
    getAuditForReview(db, { id: auditId, orgId: viewer.orgId }),
  ]);
  if (!audit || !row) notFound();
  const preparer = can(viewer.role, "CAN_PREPARE");
  const [datasets, profiles, filePrecisionM] = await Promise.all([
    preparer ? listDatasets(db, { orgId: viewer.orgId, fieldId: audit.field.id }) : Promise.resolve([]),
    preparer ? listProfiles(db, { orgId: viewer.orgId }) : Promise.resolve([]),
    surveyPrecision(db, row),
  ]);
  return (
    <>
      <PageTitle
        sub={
          <>
            <Link href={`/fields/${audit.field.id}`} className="font-medium text-leaf hover:underline">
              {audit.field.name}
            </Link>{" "}
            ·{" "}
            <Link href={`/audits/${audit.id}`} className="font-medium text-leaf hover:underline">
              audit result
            </Link>
          </>
        }
      >
        Review: {audit.title}
        <RevisionTag revision={audit.revision} />
      </PageTitle>
      <div className="mb-6">
        <ReviewBar auditId={audit.id} showReviewLink={false} timeZone={audit.field.timeZone} />
      </div>
      <ReviewWorkspace
        audit={audit}
        viewer={{ name: viewer.name, role: viewer.role }}
        checklist={
          audit.profile && audit.summary
            ? {
                pairs: audit.summary.pairs,
                minCheckpoints: audit.profile.minCheckpoints,
                tightestLimitM: tightestLimit(audit.profile),
                filePrecisionM,
                profileName: audit.profile.name,
                operation: audit.profile.operation,
              }
            : null
        }
        datasets={datasets.map((d) => ({
          id: d.id,
          kind: d.kind,
          fileName: d.fileName,
          rowCount: d.rowCount,
          uploadedAt: d.uploadedAt,
        }))}
        profiles={profiles.map((p) => ({ id: p.id, name: p.name }))}
      />
    </>
  );
}
