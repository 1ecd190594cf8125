import "server-only";
import type { DB } from "@/db/client";
import { loadDatasetPoints } from "@/db/queries/datasets";
import { getSignoff } from "@/db/queries/review";
import type { AuditDto } from "@/lib/api-types";
import { medianFinite } from "@/lib/review/checklist";

/** The checkpoint survey's own horizontal precision (metres) the accuracy statement accounts for, and where it came from. */
export interface SurveyPrecision {
  rmseH: number | null;
  /** In words, e.g. "the survey file's median stated precision (2.0 mm)"; absent when unknown. */
  source?: string;
}

/**
 * The precision confirmed at sign-off, else the survey file's median stated precision, else unknown. The result page
 * and the printable report state the same figure.
 */
export async function checkpointSurveyPrecision(
  db: DB,
  { audit, orgId }: { audit: AuditDto; orgId: string },
): Promise<SurveyPrecision> {
  const signoff = audit.state === "signed_off" ? await getSignoff(db, { auditId: audit.id, orgId }) : null;
  if (signoff) {
    const i = signoff.checklist.instrument;
    return {
      rmseH: i.precisionMm / 1000,
      source: `the survey precision confirmed at sign-off (${i.precisionMm} mm, from the ${i.source})`,
    };
  }
  if (!audit.summary || !audit.survey) return { rmseH: null };
  const points = await loadDatasetPoints(db, { id: audit.survey.id, orgId });
  const m = medianFinite(points?.table.precision ?? null);
  return m === null
    ? { rmseH: null }
    : { rmseH: m, source: `the survey file's median stated precision (${(m * 1000).toFixed(1)} mm)` };
}
