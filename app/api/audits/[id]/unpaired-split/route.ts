import { guardedRoute } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { planOfSurvey, unpairedSplitCounts } from "@/db/queries/survey-plans";
import { ANY_ROLE } from "@/lib/roles";
import { auditForViewer } from "@/lib/server/audits/audit-access";

/** Unpaired counts split by the survey's plan: not sampled, sampled but not found, surveyed but no record. */
export const GET = guardedRoute<{ id: string }>(ANY_ROLE, async ({ viewer, params }) => {
  const audit = await auditForViewer(viewer, params);
  const db = await getDb();
  const plan = audit.survey ? await planOfSurvey(db, { surveyDatasetId: audit.survey.id, orgId: viewer.orgId }) : null;
  return Response.json({ split: await unpairedSplitCounts(db, { auditId: audit.id, plan }) });
});
