import { z } from "zod";
import { guardedRoute } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { listAlerts } from "@/db/queries/alerts";
import { ANY_ROLE } from "@/lib/roles";
import { readQuery } from "@/lib/validation/request";

const Query = z.object({ open: z.enum(["true", "false"]).optional() });

/** Thresholds the organisation's audits breached, newest first (`?open=true`: not yet acknowledged). */
export const GET = guardedRoute(ANY_ROLE, async ({ req, viewer }) => {
  const q = readQuery(req, Query);
  return Response.json({ alerts: await listAlerts(await getDb(), { orgId: viewer.orgId, open: q.open === "true" }) });
});
