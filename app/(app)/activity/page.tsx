import type { Metadata } from "next";
import Link from "next/link";
import { z } from "zod";
import { requirePageViewer } from "@/lib/server/access";
import { can } from "@/lib/roles";
import { getDb } from "@/db/client";
import { listOrgActivity } from "@/db/queries/activity";
import { toActivityDtos } from "@/lib/server/review/activity";
import { Empty, PageTitle, Panel } from "@/app/_components/ui";
import { LocalTime } from "@/app/_components/local-time";

export const metadata: Metadata = { title: "Activity" };

const PAGE = 50;
/** A malformed cursor shows the latest page. */
const Query = z.object({ before: z.coerce.number().int().positive().optional().catch(undefined) });

/** Who did what in the organisation, newest first. Team and key changes are shown to owners only. */
export default async function ActivityPage({
  searchParams,
}: {
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const viewer = await requirePageViewer();
  const { before } = Query.parse(await searchParams);
  const teamChanges = can(viewer.role, "CAN_MANAGE_TEAM");
  const hideTypes = teamChanges ? [] : ["member", "invitation", "api_key"];
  const rows = toActivityDtos(
    await listOrgActivity(await getDb(), { orgId: viewer.orgId, before, limit: PAGE, hideTypes }),
  );
  return (
    <>
      <PageTitle
        sub={`Everything done in ${viewer.orgName}: uploads, audits, reviews, sign-offs, downloads${teamChanges ? ", team changes" : ""} and e-mails.`}
      >
        Activity
      </PageTitle>
      <Panel title={before ? "Earlier activity" : "Latest activity"}>
        {rows.length === 0 ? (
          <Empty>Nothing yet.</Empty>
        ) : (
          <ol className="divide-y divide-chalk-deep text-sm" data-testid="org-activity">
            {rows.map((a) => (
              <li key={a.id} className="flex flex-col gap-x-4 py-1.5 sm:flex-row" data-action={a.action}>
                <span className="shrink-0 text-ink-faint sm:w-44">
                  <LocalTime iso={a.at} />
                </span>
                {/* Long file names and hashes break rather than widen the page on a phone. */}
                <span
                  className={`min-w-0 break-words ${a.text.includes("MISMATCH") ? "font-semibold text-alarm" : ""}`}
                >
                  {a.text}
                  {a.href ? (
                    <>
                      {" "}
                      <Link href={a.href} className="text-leaf hover:underline">
                        open
                      </Link>
                    </>
                  ) : null}
                </span>
              </li>
            ))}
          </ol>
        )}
        <div className="mt-3 flex gap-4 text-sm">
          {before ? (
            <Link href="/activity" className="font-medium text-leaf hover:underline">
              Latest
            </Link>
          ) : null}
          {rows.length === PAGE ? (
            <Link href={`/activity?before=${rows.at(-1)!.id}`} className="font-medium text-leaf hover:underline">
              Earlier
            </Link>
          ) : null}
        </div>
      </Panel>
    </>
  );
}
