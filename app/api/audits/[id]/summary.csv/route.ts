import { guardedRoute } from "@/lib/server/access";
import { ANY_ROLE } from "@/lib/roles";
import { downloadReport } from "@/lib/server/audits/report-download";
import { ReportFormatQuery } from "@/lib/validation/audit";
import { readQuery } from "@/lib/validation/request";

export const GET = guardedRoute<{ id: string }>(ANY_ROLE, async ({ req, viewer, params }) =>
  downloadReport(viewer, params, "summary", readQuery(req, ReportFormatQuery)),
);
