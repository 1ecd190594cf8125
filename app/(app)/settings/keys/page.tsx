import type { Metadata } from "next";
import { requirePageViewer } from "@/lib/server/access";
import { CAN_MANAGE_KEYS } from "@/lib/roles";
import { PageTitle } from "@/app/_components/ui";
import { ApiKeysPanel } from "./api-keys-panel";

export const metadata: Metadata = { title: "API keys" };

export default async function ApiKeysPage() {
  const viewer = await requirePageViewer(CAN_MANAGE_KEYS);
  return (
    <>
      <PageTitle
        sub={`Keys let ${viewer.orgName}'s own scripts use the API without a browser, e.g. to push the planting machine's nightly export. A key acts as its creator in this organisation, limited to what its scope allows, until it is revoked or its expiry date comes.`}
      >
        API keys
      </PageTitle>
      <ApiKeysPanel />
    </>
  );
}
