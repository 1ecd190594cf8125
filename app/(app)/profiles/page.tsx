import type { Metadata } from "next";
import { requirePageViewer } from "@/lib/server/access";
import { can } from "@/lib/roles";
import { PageTitle } from "@/app/_components/ui";
import { ProfilesManager } from "./profiles-manager";

export const metadata: Metadata = { title: "Tolerance profiles" };

export default async function ProfilesPage() {
  const viewer = await requirePageViewer();
  const canEdit = can(viewer.role, "CAN_EDIT_PROFILES");
  return (
    <>
      <PageTitle
        sub={
          canEdit
            ? "The limits an audit is judged against, one set per field operation. Editing a profile never changes the verdict of a past audit."
            : "The limits an audit is judged against, one set per field operation. QA leads and owners edit them."
        }
      >
        Tolerance profiles
      </PageTitle>
      <ProfilesManager canEdit={canEdit} />
    </>
  );
}
