"use client";
import Link from "next/link";
import useSWR from "swr";
import { fetcher } from "@/lib/fetcher";
import { reviewKeys } from "@/lib/review/keys";
import type { ActivityDto } from "@/lib/review/types";
import { FieldTime, Panel } from "@/app/_components/ui";

/** Who uploaded, computed, submitted, signed, returned, verified and downloaded this audit. */
export function ActivityList({ auditId, timeZone }: { auditId: string; timeZone: string }) {
  const { data, error } = useSWR<{ activity: ActivityDto[] }>(reviewKeys.activity(auditId), fetcher);
  return (
    <Panel
      title="Activity"
      action={
        <Link href="/activity" className="text-sm font-medium text-leaf hover:underline">
          Whole organisation
        </Link>
      }
    >
      {error ? (
        <p className="text-sm text-alarm">{(error as Error).message}</p>
      ) : !data ? (
        <p className="text-sm text-ink-faint">Loading…</p>
      ) : (
        <ol className="divide-y divide-chalk-deep text-sm" data-testid="audit-activity">
          {data.activity.map((a) => (
            <li key={a.id} className="flex gap-4 py-1.5" data-action={a.action}>
              <span className="w-44 shrink-0 text-ink-faint">
                <FieldTime iso={a.at} timeZone={timeZone} />
              </span>
              <span
                className={
                  a.action === "audit.verified" && a.text.includes("MISMATCH") ? "font-semibold text-alarm" : ""
                }
              >
                {a.text}
              </span>
            </li>
          ))}
        </ol>
      )}
    </Panel>
  );
}
