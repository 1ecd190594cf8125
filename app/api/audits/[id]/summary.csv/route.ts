import { guardedRoute } from "@/lib/server/access";
import { ANY_ROLE } from "@/lib/roles";
import { downloadReport } from "@/lib/server/audits/report-download";

export const GET = guardedRoute<{ id: string }>(ANY_ROLE, async ({ viewer, params }) =>
  downloadReport(viewer, params, "summary"),
);
