import { guardedRoute } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { getDatasetFile } from "@/db/queries/datasets";
import { notFound } from "@/lib/errors";
import { ANY_ROLE } from "@/lib/roles";
import { routeId } from "@/lib/validation/request";
import { contentDisposition } from "@/lib/http";

/** The uploaded file exactly as received; its SHA-256 in a header so a script can check it. */
export const GET = guardedRoute<{ id: string }>(ANY_ROLE, async ({ viewer, params }) => {
  const id = routeId(params, "id", "Dataset");
  const file = await getDatasetFile(await getDb(), { id, orgId: viewer.orgId });
  if (!file) throw notFound("Dataset");
  return new Response(file.bytes as BodyInit, {
    headers: {
      "content-type": file.contentType,
      "content-disposition": contentDisposition(file.fileName),
      "x-content-sha256": file.sha256,
    },
  });
});
