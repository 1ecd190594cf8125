import type { Metadata } from "next";
import { requirePageViewer } from "@/lib/access";
import { PageTitle } from "@/app/_components/ui";
import { ApiKeysPanel } from "./api-keys-panel";

export const metadata: Metadata = { title: "API keys" };

export default async function ApiKeysPage() {
  const viewer = await requirePageViewer(["owner"]);
  return (
    <>
      <PageTitle
        sub={`Keys let ${viewer.orgName}'s own scripts use the API without a browser, e.g. to push the planting machine's nightly export. A key acts as its creator (owner role) in this organisation.`}
      >
        API keys
      </PageTitle>
      <ApiKeysPanel />
    </>
  );
}
