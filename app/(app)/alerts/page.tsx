import type { Metadata } from "next";
import { requirePageViewer } from "@/lib/server/access";
import { can } from "@/lib/roles";
import { PageTitle } from "@/app/_components/ui";
import { AlertsView } from "./alerts-view";

export const metadata: Metadata = { title: "Alerts" };

export default async function AlertsPage() {
  const viewer = await requirePageViewer();
  const canSet = can(viewer.role, "CAN_SET_ALERTS");
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
      <AlertsView canSet={canSet} />
    </>
  );
}
