import type { Metadata } from "next";
import { requirePageViewer } from "@/lib/server/access";
import { can } from "@/lib/roles";
import { getDb } from "@/db/client";
import { getAlertRules, listAlerts } from "@/db/queries/alerts";
import { PageTitle } from "@/app/_components/ui";
import { AlertsView } from "./alerts-view";

export const metadata: Metadata = { title: "Alerts" };

export default async function AlertsPage() {
  const viewer = await requirePageViewer();
  const canSet = can(viewer.role, "CAN_SET_ALERTS");
  // The first thresholds and alerts come with the page (the same queries as the GET routes); the client refreshes them.
  const db = await getDb();
  const [rules, alerts] = await Promise.all([
    getAlertRules(db, { orgId: viewer.orgId }),
    listAlerts(db, { orgId: viewer.orgId, open: false }),
  ]);
  return (
    <>
      <PageTitle
        sub={
          canSet
            ? "Thresholds every computed audit is checked against. A breach is listed here and e-mailed to the owners and QA leads."
            : "Thresholds every computed audit is checked against; QA leads and owners set them and are e-mailed when an audit crosses one."
        }
      >
        Alerts
      </PageTitle>
      <AlertsView canSet={canSet} initial={{ rules: { rules }, alerts: { alerts } }} />
    </>
  );
}
