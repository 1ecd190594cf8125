import type { Metadata } from "next";
import { requirePageViewer } from "@/lib/server/access";
import { can } from "@/lib/roles";
import { getDb } from "@/db/client";
import { listMachines } from "@/db/queries/machines";
import { PageTitle } from "@/app/_components/ui";
import { MachinesManager } from "./machines-manager";

export const metadata: Metadata = { title: "Machines" };

export default async function MachinesPage() {
  const viewer = await requirePageViewer();
  const canEdit = can(viewer.role, "CAN_MANAGE_MACHINES");
  // The first list comes with the page (the same query as GET /api/machines); the client keeps it fresh.
  const machines = await listMachines(await getDb(), { orgId: viewer.orgId });
  return (
    <>
      <PageTitle
        sub={
          canEdit
            ? "The planting machines whose records you audit. An as-planted upload names its machine, so each machine has its own season and each audit is compared with the same machine's previous one."
            : "The planting machines whose records you audit. QA leads and owners keep this list."
        }
      >
        Machines
      </PageTitle>
      <MachinesManager canEdit={canEdit} initial={{ machines }} />
    </>
  );
}
