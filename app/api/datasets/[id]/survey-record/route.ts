import { guardedRoute } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { getDatasetById } from "@/db/queries/datasets";
import { getSurveyRecord } from "@/db/queries/survey-plans";
import { notFound } from "@/lib/errors";
import { ANY_ROLE } from "@/lib/roles";
import { routeId } from "@/lib/validation/request";

/** What a survey upload recorded about its fieldwork (plan, control-mark check, instrument, coverage); null if none. */
export const GET = guardedRoute<{ id: string }>(ANY_ROLE, async ({ viewer, params }) => {
  const id = routeId(params, "id", "Dataset");
  const db = await getDb();
  if (!(await getDatasetById(db, { id, orgId: viewer.orgId }))) throw notFound("Dataset");
  return Response.json({ record: await getSurveyRecord(db, { datasetId: id, orgId: viewer.orgId }) });
});
