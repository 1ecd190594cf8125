import type { Metadata } from "next";
import { requirePageViewer } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { listFields } from "@/db/queries/fields";
import Link from "next/link";
import { Empty, PageTitle, Panel, TextLink, formatMm, TableScroll } from "@/app/_components/ui";
import { can } from "@/lib/roles";

export const metadata: Metadata = { title: "Fields" };

export default async function FieldsPage() {
  const viewer = await requirePageViewer();
  const fields = await listFields(await getDb(), { orgId: viewer.orgId });
  return (
    <>
      <PageTitle sub={`${viewer.orgName} · ${fields.length} field${fields.length === 1 ? "" : "s"}`}>Fields</PageTitle>
      <Panel
        title="All fields"
        action={
          can(viewer.role, "CAN_PREPARE") ? (
            <Link
              href="/fields/new"
              className="rounded-plot bg-leaf px-3 py-1.5 text-sm font-medium text-white hover:bg-leaf-deep"
            >
              New field
            </Link>
          ) : undefined
        }
      >
        {fields.length === 0 ? (
          <Empty>No fields yet.</Empty>
        ) : (
          <TableScroll label="Fields">
            <table className="w-full text-left text-sm" data-testid="field-list">
              <thead className="text-ink-faint">
                <tr>
                  <th className="py-1 font-medium">Field</th>
                  <th className="font-medium">Farm</th>
                  <th className="font-medium">CRS</th>
                  <th className="font-medium">Files</th>
                  <th className="font-medium">Latest horizontal RMSE</th>
                </tr>
              </thead>
              <tbody className="divide-y divide-chalk-deep">
                {fields.map((f) => (
                  <tr key={f.id}>
                    <td className="py-2">
                      <TextLink href={`/fields/${f.id}`}>{f.name}</TextLink>
                    </td>
                    <td>{f.farm}</td>
                    <td className="font-mono text-xs">{f.crs}</td>
                    <td>{f.datasetCount}</td>
                    <td>{formatMm(f.latestAudit?.rmseR)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </TableScroll>
        )}
      </Panel>
    </>
  );
}
