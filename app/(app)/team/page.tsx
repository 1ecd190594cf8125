import type { Metadata } from "next";
import { requirePageViewer } from "@/lib/access";
import { getDb } from "@/db/client";
import { listTeamMembers } from "@/db/queries/members";
import { PageTitle, Panel } from "@/app/_components/ui";
import { ROLE_DUTY, ROLE_LABEL } from "@/lib/roles";

export const metadata: Metadata = { title: "Team" };

export default async function TeamPage() {
  const viewer = await requirePageViewer(["owner"]);
  const members = await listTeamMembers(await getDb(), { orgId: viewer.orgId });
  return (
    <>
      <PageTitle sub={viewer.orgName}>Team</PageTitle>
      <Panel title="Members">
        <table className="w-full text-left text-sm" data-testid="team-table">
          <thead className="text-ink-faint"><tr><th className="py-1 font-medium">Name</th><th className="font-medium">E-mail</th><th className="font-medium">Role</th><th className="font-medium">Does</th></tr></thead>
          <tbody className="divide-y divide-chalk-deep">
            {members.map((m) => (
              <tr key={m.memberId}><td className="py-2">{m.name}</td><td>{m.email}</td><td>{ROLE_LABEL[m.role]}</td><td className="text-ink-soft">{ROLE_DUTY[m.role]}</td></tr>
            ))}
          </tbody>
        </table>
      </Panel>
    </>
  );
}
