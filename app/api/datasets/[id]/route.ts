import { guardedRoute } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { deleteDataset, getDatasetById } from "@/db/queries/datasets";
import { discardObjects } from "@/lib/server/storage";
import { AppError, notFound } from "@/lib/errors";
import { ANY_ROLE, CAN_PREPARE } from "@/lib/roles";
import { routeId } from "@/lib/validation/request";

export const GET = guardedRoute<{ id: string }>(ANY_ROLE, async ({ viewer, params }) => {
  const id = routeId(params, "id", "Dataset");
  const dataset = await getDatasetById(await getDb(), { id, orgId: viewer.orgId });
  if (!dataset) throw notFound("Dataset");
  return Response.json({ dataset });
});

/** Delete a dataset no audit uses; otherwise 409 with the reason. */
export const DELETE = guardedRoute<{ id: string }>(CAN_PREPARE, async ({ viewer, params }) => {
  const id = routeId(params, "id", "Dataset");
  const result = await deleteDataset(await getDb(), { id, orgId: viewer.orgId, userId: viewer.userId });
  if (result === "missing") throw notFound("Dataset");
  if ("keptBecause" in result) throw new AppError("conflict", result.keptBecause);
  await discardObjects([result.deleted.objectKey]);
  return new Response(null, { status: 204 });
});
