import { z } from "zod";
import { guardedRoute } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { listAudits } from "@/db/queries/audits";
import { ANY_ROLE, CAN_PREPARE } from "@/lib/roles";
import { AuditCreateInput } from "@/lib/validation/audit";
import { RecordId } from "@/lib/validation/ids";
import { readJsonBody, readQuery } from "@/lib/validation/request";
import { startAudit } from "@/lib/server/audits/run-audit";

/** A malformed filter lists without any filter, as if none was given. */
const ListQuery = z
  .object({ fieldId: RecordId.optional(), state: z.string().max(20).optional() })
  .catch({ fieldId: undefined, state: undefined });

export const GET = guardedRoute(ANY_ROLE, async ({ req, viewer }) => {
  const filter = readQuery(req, ListQuery);
  return Response.json({ audits: await listAudits(await getDb(), { orgId: viewer.orgId, ...filter, limit: 200 }) });
});

/** Create and compute an audit: 202 while it computes, or 201 when finished with `?wait=1`. */
export const POST = guardedRoute(CAN_PREPARE, async ({ req, viewer }) => {
  const input = await readJsonBody(req, AuditCreateInput);
  const wait = new URL(req.url).searchParams.get("wait") === "1";
  const audit = await startAudit(viewer, input, { wait });
  return Response.json({ audit }, { status: wait ? 201 : 202 });
});
