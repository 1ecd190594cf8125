import { z } from "zod";
import { guardedRoute } from "@/lib/access";
import { getDb } from "@/db/client";
import { listAudits } from "@/db/queries/audits";
import { ANY_ROLE, CAN_PREPARE } from "@/lib/roles";
import { AuditCreateInput } from "@/lib/validation/audit";
import { parseJsonBody } from "@/lib/validation/request";
import { startAudit } from "@/lib/server/audits/run-audit";

const ListQuery = z.object({ fieldId: z.uuid().optional(), state: z.string().max(20).optional() });

export const GET = guardedRoute(ANY_ROLE, async ({ req, viewer }) => {
  const q = ListQuery.safeParse(Object.fromEntries(new URL(req.url).searchParams));
  const filter = q.success ? q.data : {};
  return Response.json({ audits: await listAudits(await getDb(), { orgId: viewer.orgId, ...filter, limit: 200 }) });
});

/** Create and compute an audit: 202 while it computes, or 201 when finished with `?wait=1`. */
export const POST = guardedRoute(CAN_PREPARE, async ({ req, viewer }) => {
  const input = await parseJsonBody(req, AuditCreateInput);
  const wait = new URL(req.url).searchParams.get("wait") === "1";
  const audit = await startAudit(viewer, input, { wait });
  return Response.json({ audit }, { status: wait ? 201 : 202 });
});
