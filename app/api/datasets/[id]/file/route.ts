import { guardedRoute } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { getDatasetFile } from "@/db/queries/datasets";
import { notFound } from "@/lib/errors";
import { ANY_ROLE } from "@/lib/roles";
import { routeId } from "@/lib/validation/request";
import { contentDisposition } from "@/lib/http";
import { readStored } from "@/lib/server/storage";

/**
 * The uploaded file exactly as received; its SHA-256 in a header so a script can check it. A file kept in the
 * object store is checked against that SHA-256 first: a changed or missing object is a 409 saying so.
 */
export const GET = guardedRoute<{ id: string }>(ANY_ROLE, async ({ viewer, params }) => {
  const id = routeId(params, "id", "Dataset");
  const file = await getDatasetFile(await getDb(), { id, orgId: viewer.orgId });
  if (!file) throw notFound("Dataset");
  const bytes = await readStored(file, file.fileName, { sha256: file.sha256 });
  return new Response(bytes as BodyInit, {
    headers: {
      "content-type": file.contentType,
      "content-disposition": contentDisposition(file.fileName),
      "x-content-sha256": file.sha256,
    },
  });
});
